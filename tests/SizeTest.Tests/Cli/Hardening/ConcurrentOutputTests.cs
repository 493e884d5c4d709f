using SizeTest.Foundation.Files;
using System.Diagnostics;
using System.Text.Json;
using Xunit;

namespace SizeTest.Tests.Cli.Hardening;

/// <summary>
/// Issue 14 point 4 with real processes: two <c>sizetest fit</c> processes started together on one <c>--out</c>.
/// The outcome is defined: without <c>--force</c> exactly one succeeds and the other exits 2 naming the other run
/// (its lock) or the finished folder; with <c>--force</c> on an earlier result, the runs either serialise (both
/// succeed, the later replaces the earlier whole) or one is refused by the lock. In every case the folder ends
/// complete — a parseable results.json, and a marker that lists exactly the files present — with no staging or lock
/// left behind, and the catalogue byte-identical. Also: an output folder that cannot be written (an immutable
/// folder) is exit 2 with one line, never an internal error.
/// </summary>
public sealed class ConcurrentOutputTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-concurrent-").FullName;

    public void Dispose()
    {
        try { Directory.Delete(_dir, true); } catch (IOException) { }
    }

    private string[] FitArgs(bool force)
    {
        // Bootstrap resamples make each run last long enough (≈ 1 s) that the two overlap.
        string[] args = ["fit", "c.csv", .. HardeningData.ColArgs, "--models", "eds", "--starts", "1", "--cv-folds", "0", "--bootstrap", "40", "--seed", "1", "--out", "res"];
        return force ? [.. args, "--force"] : args;
    }

    private (int Exit, string Err)[] RunTwoAtOnce(bool force)
    {
        var procs = new[] { Process.Start(CliProcess.Info(_dir, FitArgs(force)))!, Process.Start(CliProcess.Info(_dir, FitArgs(force)))! };
        var errs = procs.Select(p => p.StandardError.ReadToEndAsync()).ToArray();
        foreach (var p in procs) _ = p.StandardOutput.ReadToEndAsync();
        foreach (var p in procs)
            if (!p.WaitForExit(180_000)) { p.Kill(true); Assert.Fail("a concurrent run did not finish within 180 s"); }
        var result = procs.Select((p, i) => (p.ExitCode, errs[i].Result)).ToArray();
        foreach (var p in procs) p.Dispose();
        return result;
    }

    private void AssertCompleteAndClean(byte[] catalogue)
    {
        var res = Path.Combine(_dir, "res");
        using (var doc = JsonDocument.Parse(File.ReadAllText(Path.Combine(res, "results.json"))))
            Assert.True(doc.RootElement.TryGetProperty("models", out _));
        var listed = File.ReadAllLines(Path.Combine(res, ".sizetest-output")).Where(l => l.Length > 0 && !l.StartsWith('#')).OrderBy(x => x, StringComparer.Ordinal);
        var present = Directory.EnumerateFiles(res, "*", new EnumerationOptions { RecurseSubdirectories = true, AttributesToSkip = 0 })
            .Select(f => Path.GetRelativePath(res, f)).Where(f => f != ".sizetest-output").OrderBy(x => x, StringComparer.Ordinal);
        Assert.Equal(listed, present);
        Assert.Empty(HardeningData.StagingLeft(_dir));
        Assert.True(catalogue.AsSpan().SequenceEqual(File.ReadAllBytes(Path.Combine(_dir, "c.csv"))), "the catalogue changed");
    }

    [Fact]
    public void TwoRunsOnOneNewFolderOneWinsTheOtherIsRefused()
    {
        File.WriteAllText(Path.Combine(_dir, "c.csv"), HardeningData.CatalogueText(300));
        var catalogue = File.ReadAllBytes(Path.Combine(_dir, "c.csv"));
        var runs = RunTwoAtOnce(force: false);
        Assert.Equal([0, 2], runs.Select(r => r.Exit).OrderBy(e => e));
        var refused = runs.Single(r => r.Exit == 2).Err.Trim();
        Assert.Single(refused.Split('\n'));
        Assert.True(refused.Contains("being written by another sizetest run") || refused.Contains("already exists"), refused);
        Assert.DoesNotContain("internal error", refused);
        AssertCompleteAndClean(catalogue);
    }

    [Fact]
    public void TwoForcedRunsOnAnEarlierResultLeaveOneCompleteResult()
    {
        File.WriteAllText(Path.Combine(_dir, "c.csv"), HardeningData.CatalogueText(300));
        var catalogue = File.ReadAllBytes(Path.Combine(_dir, "c.csv"));
        var first = CliProcess.Run(_dir, FitArgs(force: false));
        Assert.True(first.Exit == 0, first.Err);
        var runs = RunTwoAtOnce(force: true);
        foreach (var r in runs)
        {
            Assert.True(r.Exit is 0 or 2, r.Err);
            Assert.DoesNotContain("internal error", r.Err);
            if (r.Exit == 2) Assert.Contains("being written by another sizetest run", r.Err);
        }
        Assert.Contains(0, runs.Select(r => r.Exit));
        AssertCompleteAndClean(catalogue);
    }

    [Fact]
    public void AnUnwritableOutputFolderIsExit2WithOneLine()
    {
        File.WriteAllText(Path.Combine(_dir, "c.csv"), HardeningData.CatalogueText(40));
        var frozen = Directory.CreateDirectory(Path.Combine(_dir, "frozen")).FullName;
        // An immutable folder (chattr +i: not even root may create entries in it). Where the file system has no
        // such attribute, /proc/1 stands in: no process, root included, may create a folder there.
        bool immutable = RunTool("chattr", "+i", frozen) == 0;
        string parent = immutable ? frozen : "/proc/1";
        try
        {
            foreach (var target in new[] { Path.Combine(parent, "res"), parent })
            {
                var (exit, _, err, _) = CliProcess.Run(_dir, ["fit", "c.csv", .. HardeningData.ColArgs, .. HardeningData.Quick, "--out", target]);
                Assert.Equal(2, exit);
                Assert.Single(err.Trim().Split('\n'), l => l.StartsWith("sizetest: ", StringComparison.Ordinal));
                Assert.Contains("choose another --out", err);
                Assert.DoesNotContain("internal error", err);
            }
            if (immutable) Assert.Empty(Directory.EnumerateFileSystemEntries(frozen));
        }
        finally
        {
            if (immutable) RunTool("chattr", "-i", frozen);
        }
    }

    /// <summary>
    /// An earlier result that the file system forbids changing (the folder, or one file in it, chattr +i; the
    /// folder chattr +a) is refused by <c>--force</c> at the start, before the work, with exit 2 and one line;
    /// the earlier result stays byte for byte and nothing staged is left. Before, the whole fit ran and the
    /// final rename failed. Where the file system has no such flags (chattr fails) there is nothing to refuse,
    /// and the test checks only that FileSystemLocks reports no lock.
    /// </summary>
    [Fact]
    public void AnImmutableEarlierResultIsRefusedBeforeTheRunStarts()
    {
        File.WriteAllText(Path.Combine(_dir, "c.csv"), HardeningData.CatalogueText(40));
        var res = Path.Combine(_dir, "res");
        Assert.Equal(0, CliProcess.Run(_dir, ["fit", "c.csv", .. HardeningData.ColArgs, .. HardeningData.Quick, "--out", "res"]).Exit);
        var before = Directory.EnumerateFiles(res, "*", SearchOption.AllDirectories).ToDictionary(f => f, File.ReadAllBytes);
        var results = Path.Combine(res, "results.json");
        foreach (var (flag, entry) in new[] { ("+i", res), ("+i", results), ("+a", res) })
        {
            if (RunTool("chattr", flag, entry) != 0)
            {
                Assert.False(FileSystemLocks.IsImmutable(entry));
                continue;
            }
            try
            {
                Assert.True(FileSystemLocks.IsImmutable(entry), $"chattr {flag} {entry} is not seen");
                // Bootstrap resamples make the fit itself take about a second; the refusal must come first.
                var (exit, stdout, err, _) = CliProcess.Run(_dir, ["fit", "c.csv", .. HardeningData.ColArgs, .. HardeningData.Quick, "--bootstrap", "40", "--out", "res", "--force"]);
                Assert.Equal(2, exit);
                var line = Assert.Single(err.Trim().Split('\n'), l => l.StartsWith("sizetest: ", StringComparison.Ordinal));
                Assert.Contains("immutable", line);
                Assert.Contains("choose another --out", line);
                Assert.DoesNotContain("internal error", err);
                Assert.DoesNotContain("bootstrap", stdout + err, StringComparison.OrdinalIgnoreCase);
            }
            finally
            {
                RunTool("chattr", flag.Replace('+', '-'), entry);
            }
            Assert.Equal(before.Keys.Order(), Directory.EnumerateFiles(res, "*", SearchOption.AllDirectories).Order());
            foreach (var (f, bytes) in before) Assert.Equal(bytes, File.ReadAllBytes(f));
            Assert.Equal(["c.csv", "res"], Directory.EnumerateFileSystemEntries(_dir).Select(Path.GetFileName).Order());
        }
        Assert.False(FileSystemLocks.IsImmutable(res));
    }

    private static int RunTool(string tool, params string[] args)
    {
        try
        {
            var psi = new ProcessStartInfo(tool) { RedirectStandardError = true, RedirectStandardOutput = true, UseShellExecute = false };
            foreach (var a in args) psi.ArgumentList.Add(a);
            using var p = Process.Start(psi)!;
            p.WaitForExit();
            return p.ExitCode;
        }
        catch (System.ComponentModel.Win32Exception) { return -1; }
    }
}

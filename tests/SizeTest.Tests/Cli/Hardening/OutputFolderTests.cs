using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Files;
using Xunit;

namespace SizeTest.Tests.Cli.Hardening;

/// <summary>
/// Issue 14 point 1 and 4: SizeTest replaces only folders and files it wrote, never an input, and two runs on
/// one folder cannot interleave. Every reproduction of the issue is here with its exit code and a byte-exact check.
/// </summary>
public sealed class OutputFolderTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-owned-").FullName;

    public void Dispose()
    {
        try { Directory.Delete(_dir, true); } catch (IOException) { }
    }

    [Fact]
    public void FitWithOutIntoTheCatalogueFolderAndForceLeavesItByteIdentical()
    {
        // Reproduction 1a: sizetest fit data/c.csv --out data --force deleted c.csv and every other file.
        var data = Directory.CreateDirectory(Path.Combine(_dir, "data")).FullName;
        File.WriteAllText(Path.Combine(data, "c.csv"), HardeningData.CatalogueText());
        File.WriteAllText(Path.Combine(data, "notes.txt"), "my notes");
        var before = HardeningData.Snapshot(data);
        var (exit, _, err, _) = CliProcess.Run(_dir, ["fit", "data/c.csv", .. HardeningData.ColArgs, .. HardeningData.Quick, "--out", "data", "--force"]);
        Assert.Equal(2, exit);
        Assert.Contains("'c.csv', an input of this run", err);
        Assert.Single(err.Trim().Split('\n'));
        HardeningData.AssertSame(before, HardeningData.Snapshot(data));
        Assert.Empty(HardeningData.StagingLeft(_dir));
    }

    [Fact]
    public void RunWithOutDotAndForceLeavesTheStudyFolderByteIdentical()
    {
        // Reproduction 1b: run s1.toml --out . --force removed the study file, the catalogue folder and a paper draft.
        Directory.CreateDirectory(Path.Combine(_dir, "cat"));
        File.WriteAllText(Path.Combine(_dir, "cat", "mock.csv"), HardeningData.CatalogueText());
        File.WriteAllText(Path.Combine(_dir, "paper.tex"), "\\documentclass{article} draft");
        File.WriteAllText(Path.Combine(_dir, "s1.toml"), """
            name = "owned-folder"
            [catalogue]
            path = "cat/mock.csv"
            [columns]
            z = "z"
            theta = "theta_arcsec:arcsec"
            [models]
            names = ["eds"]
            [inference]
            starts = 1
            """);
        var before = HardeningData.Snapshot(_dir);
        var (exit, _, err, _) = CliProcess.Run(_dir, ["run", "s1.toml", "--out", ".", "--force"]);
        Assert.Equal(2, exit);
        Assert.Contains("an input of this run", err);
        HardeningData.AssertSame(before, HardeningData.Snapshot(_dir));
    }

    [Fact]
    public void ForceReplacesOnlyAFolderSizeTestWroteAndOnlyItsFiles()
    {
        var cat = Path.Combine(_dir, "c.csv");
        File.WriteAllText(cat, HardeningData.CatalogueText());
        var outDir = Path.Combine(_dir, "out");
        var first = CliRunner.Run(["fit", cat, .. HardeningData.ColArgs, .. HardeningData.Quick, "--out", outDir]);
        Assert.True(first.Exit == 0, first.Err);
        var marker = OutputFolder.ReadMarker(outDir);
        Assert.NotNull(marker);
        Assert.Contains("results.json", marker);
        Assert.Contains("rejects.csv", marker);

        // A second run with --force replaces the folder it wrote.
        var again = CliRunner.Run(["fit", cat, .. HardeningData.ColArgs, .. HardeningData.Quick, "--out", outDir, "--force"]);
        Assert.True(again.Exit == 0, again.Err);

        // A file the user put there stops --force (exit 2) and nothing is touched.
        File.WriteAllText(Path.Combine(outDir, "my-plot.py"), "print('mine')");
        var before = HardeningData.Snapshot(outDir);
        var refused = CliRunner.Run(["fit", cat, .. HardeningData.ColArgs, .. HardeningData.Quick, "--out", outDir, "--force"]);
        Assert.Equal(2, refused.Exit);
        Assert.Contains("'my-plot.py', which sizetest did not write", refused.Err);
        HardeningData.AssertSame(before, HardeningData.Snapshot(outDir));

        // A folder without the marker is never replaced, even with --force.
        var foreign = Directory.CreateDirectory(Path.Combine(_dir, "foreign")).FullName;
        File.WriteAllText(Path.Combine(foreign, "results.json"), "{}");
        var f = CliRunner.Run(["fit", cat, .. HardeningData.ColArgs, .. HardeningData.Quick, "--out", foreign, "--force"]);
        Assert.Equal(2, f.Exit);
        Assert.Contains("was not written by sizetest", f.Err);
        Assert.Equal("{}", File.ReadAllText(Path.Combine(foreign, "results.json")));
        Assert.Empty(HardeningData.StagingLeft(_dir));
    }

    [Fact]
    public void ALockStopsASecondRunAndCommitRechecksTheTarget()
    {
        var target = Path.Combine(_dir, "res");
        using (var a = OutputFolder.Begin(target, force: false))
        {
            var e = Assert.Throws<InputException>(() => OutputFolder.Begin(target, force: false));
            Assert.Contains("being written by another sizetest run", e.Message);
            File.WriteAllText(a.PathOf("results.json"), "A");
            a.Commit();
        }
        Assert.Equal("A", File.ReadAllText(Path.Combine(target, "results.json")));

        // Another writer fills the folder between Begin and Commit: Commit refuses and removes its staging folder.
        var late = Path.Combine(_dir, "late");
        var b = OutputFolder.Begin(late, force: false);
        File.WriteAllText(b.PathOf("results.json"), "B");
        Directory.CreateDirectory(late);
        File.WriteAllText(Path.Combine(late, "results.json"), "other run");
        var ex = Assert.Throws<InputException>(() => b.Commit());
        Assert.Contains("was written by another run", ex.Message);
        Assert.Equal("other run", File.ReadAllText(Path.Combine(late, "results.json")));
        Assert.Empty(HardeningData.StagingLeft(_dir));
    }

    [Fact]
    public void StaleStagingOfADeadProcessIsRemovedAndALiveOneKept()
    {
        // PID 2147480000 is above Linux's largest pid_max (2^22), so no process has it.
        var dead = Directory.CreateDirectory(Path.Combine(_dir, $".res.tmp-2147480000-{Guid.NewGuid():N}")).FullName;
        File.WriteAllText(Path.Combine(dead, "chains_eds.csv"), "partial");
        var live = Directory.CreateDirectory(Path.Combine(_dir, $".res.tmp-{Environment.ProcessId}-{Guid.NewGuid():N}")).FullName;
        var unrelated = Directory.CreateDirectory(Path.Combine(_dir, ".res.tmp-notapid")).FullName;
        using var f = OutputFolder.Begin(Path.Combine(_dir, "res"), force: false);
        Assert.False(Directory.Exists(dead));
        Assert.True(Directory.Exists(live));
        Assert.True(Directory.Exists(unrelated));
        Assert.Contains(dead, f.RemovedStale);
    }

    [Theory]
    [InlineData("")]
    [InlineData("  ")]
    public void EmptyOutIsAClearExit2(string value)
    {
        var cat = Path.Combine(_dir, "c.csv");
        File.WriteAllText(cat, HardeningData.CatalogueText(20));
        var (exit, _, err) = CliRunner.Run(["fit", cat, .. HardeningData.ColArgs, .. HardeningData.Quick, "--out", value]);
        Assert.Equal(2, exit);
        Assert.Contains("output folder is empty", err);
    }

    [Fact]
    public void OutUnderAFileOrOnSysIsExit2NamingThePath()
    {
        var cat = Path.Combine(_dir, "c.csv");
        File.WriteAllText(cat, HardeningData.CatalogueText(20));
        var under = CliRunner.Run(["fit", cat, .. HardeningData.ColArgs, .. HardeningData.Quick, "--out", Path.Combine(cat, "x")]);
        Assert.Equal(2, under.Exit);
        Assert.Contains("which is a file", under.Err);
        if (Directory.Exists("/sys/kernel"))
        {
            var sys = CliRunner.Run(["fit", cat, .. HardeningData.ColArgs, .. HardeningData.Quick, "--out", "/sys/kernel/sizetest-out"]);
            Assert.Equal(2, sys.Exit);
            Assert.Contains("/sys/kernel", sys.Err);
            Assert.DoesNotContain("internal error", sys.Err);
        }
    }

    [Fact]
    public void InspectRejectLogOntoAFolderIsExit2AndTheFolderIsKept()
    {
        // Issue 14 point 6: `inspect --reject-log DIR` was an internal error.
        var cat = Path.Combine(_dir, "c.csv");
        File.WriteAllText(cat, HardeningData.CatalogueText(20));
        var folder = Directory.CreateDirectory(Path.Combine(_dir, "rl")).FullName;
        File.WriteAllText(Path.Combine(folder, "keep.txt"), "mine");
        var (exit, _, err) = CliRunner.Run(["inspect", cat, "--reject-log", folder]);
        Assert.Equal(2, exit);
        Assert.Contains("is a folder; name a file", err);
        Assert.Equal("mine", File.ReadAllText(Path.Combine(folder, "keep.txt")));
        Assert.Contains(Path.Combine(folder, "rejects.csv"), err); // the message suggests a file in that folder
    }

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    public void InspectRejectLogOntoTheCatalogueItselfIsRefusedEvenWithForceAndTheCatalogueIsKept(bool viaSymlink)
    {
        // `inspect CAT --reject-log CAT --force` replaced the catalogue with its reject log (found re-checking issue 14).
        var cat = Path.Combine(_dir, "c.csv");
        File.WriteAllText(cat, HardeningData.CatalogueText(20));
        var before = File.ReadAllBytes(cat);
        var target = cat;
        if (viaSymlink)
        {
            target = Path.Combine(_dir, "link.csv");
            File.CreateSymbolicLink(target, cat);
        }
        var (exit, _, err) = CliRunner.Run(["inspect", cat, "--reject-log", target, "--force"]);
        Assert.Equal(2, exit);
        Assert.Contains("is the catalogue being read", err);
        Assert.Equal(before, File.ReadAllBytes(cat));
    }
}

using System.Text;
using SizeTest.Catalogues;
using SizeTest.Foundation.Errors;
using SizeTest.Studies;
using SizeTest.Tests.Cli;
using Xunit;
using Xunit.Abstractions;

namespace SizeTest.Tests.Hardening;

/// <summary>
/// A deterministic fuzz suite: for each input format (CSV, FITS, VOTable, Parquet catalogues and TOML study files),
/// <see cref="FilesPerFormat"/> damaged copies of a small valid file are read in-process. Every file must end either
/// with every row accounted for (rows read = accepted + rejected) or with one <see cref="InputException"/> (the
/// CLI's exit 2) — never another exception type (the CLI's "internal error"). Each read must also stay under
/// <see cref="AllocationCeilingBytes"/> of allocation on the reading thread, so a damaged size field cannot make a
/// reader allocate what the file does not hold. A smaller sample goes through the real CLI process, where the peak
/// resident set (VmHWM) is measured against <see cref="ProcessRssCeilingBytes"/>.
/// </summary>
/// <remarks>
/// Damage kinds (chosen by a seeded generator, so a failure names a reproducible case): byte flips, truncation,
/// inserted random bytes, a duplicated block, a zeroed block, and digits written over a random place (which hits
/// size fields such as FITS NAXIS2/TFORM, VOTable arraysize, Parquet lengths, or TOML values).
/// </remarks>
public sealed class FuzzedInputTests(ITestOutputHelper output)
{
    /// <summary>Damaged files per format (the issue asks for at least 300).</summary>
    public const int FilesPerFormat = 320;

    /// <summary>Allocation allowed per read of a file of a few kB: 64 MiB (a reader that trusts a damaged length would
    /// ask for gigabytes; a correct one needs well under a megabyte here).</summary>
    public const long AllocationCeilingBytes = 64L << 20;

    /// <summary>Peak resident set of a CLI process reading one damaged file: 400 MiB (the .NET runtime with the
    /// program loaded takes about 100 MiB).</summary>
    public const long ProcessRssCeilingBytes = 400L << 20;

    private static readonly object SeedLock = new();
    private static string? _seedDir;

    /// <summary>Valid small catalogues written by <c>sizetest simulate</c> (40 synthetic objects, seed 5).</summary>
    internal static string SeedFile(string extension)
    {
        lock (SeedLock)
        {
            if (_seedDir is null)
            {
                var dir = Path.Combine(Path.GetTempPath(), $"sizetest-fuzz-seeds-{Environment.ProcessId}");
                Directory.CreateDirectory(dir);
                foreach (var ext in new[] { "csv", "fits", "vot", "parquet" })
                {
                    var r = CliRunner.Run("simulate", "--n", "40", "--seed", "5", "--out", Path.Combine(dir, $"seed.{ext}"));
                    Assert.True(r.Exit == 0, r.Err);
                }
                _seedDir = dir;
            }
            return Path.Combine(_seedDir, $"seed.{extension}");
        }
    }

    [Theory]
    [InlineData("csv", 101)]
    [InlineData("fits", 202)]
    [InlineData("vot", 303)]
    [InlineData("parquet", 404)]
    public void DamagedCataloguesAreReadWhollyOrRefusedAsInput(string extension, int seed)
    {
        byte[] valid = File.ReadAllBytes(SeedFile(extension));
        var dir = Directory.CreateTempSubdirectory("sizetest-fuzz-").FullName;
        var random = new Random(seed);
        int refused = 0, read = 0;
        var failures = new List<string>();
        long worstAllocation = 0;
        try
        {
            for (int k = 0; k < FilesPerFormat; k++)
            {
                var (bytes, damage) = Damage(valid, random, extension == "csv" || extension == "vot");
                var path = Path.Combine(dir, $"f{k:D3}.{extension}");
                File.WriteAllBytes(path, bytes);
                bool wasRefused = ReadOrRefuse(path, $"{extension} #{k} ({damage})", failures, out long allocated);
                if (wasRefused) refused++; else read++;
                worstAllocation = Math.Max(worstAllocation, allocated);
            }
        }
        finally { Directory.Delete(dir, true); }
        output.WriteLine($"{extension}: {FilesPerFormat} damaged files: {read} read with every row accounted for, {refused} refused as input errors; largest allocation {worstAllocation / 1024} KiB");
        Assert.True(failures.Count == 0, string.Join("\n", failures.Take(20)));
        Assert.Equal(FilesPerFormat, read + refused);
    }

    [Fact]
    public void DamagedStudyFilesAreParsedOrRefusedAsInput()
    {
        var studyPath = Path.Combine(SizeTest.Tests.Studies.StudyFileParserTests.RepoRoot(), "demo-catalogs", "demo-study.toml");
        byte[] valid = File.ReadAllBytes(studyPath);
        var random = new Random(505);
        int refused = 0, parsed = 0;
        var failures = new List<string>();
        for (int k = 0; k < FilesPerFormat; k++)
        {
            var (bytes, damage) = Damage(valid, random, text: true);
            string text = Encoding.UTF8.GetString(bytes);
            long before = GC.GetAllocatedBytesForCurrentThread();
            try
            {
                StudyFileParser.Parse(text, $"fuzz{k:D3}.toml", Path.GetDirectoryName(studyPath)!);
                parsed++;
            }
            catch (InputException e)
            {
                refused++;
                if (e.Message.Contains('\n')) failures.Add($"toml #{k} ({damage}): message is not one line: {e.Message}");
            }
            catch (Exception e) when (e is not OutOfMemoryException)
            {
                failures.Add($"toml #{k} ({damage}): {e.GetType().Name}: {e.Message}");
            }
            long allocated = GC.GetAllocatedBytesForCurrentThread() - before;
            if (allocated > AllocationCeilingBytes) failures.Add($"toml #{k} ({damage}): allocated {allocated / (1 << 20)} MiB");
        }
        output.WriteLine($"toml: {FilesPerFormat} damaged study files: {parsed} parsed, {refused} refused as input errors");
        Assert.True(failures.Count == 0, string.Join("\n", failures.Take(20)));
    }

    [Fact]
    public void DeeplyNestedStudyFileIsAnInputErrorWithItsLine()
    {
        // 65 nested arrays: past both our limit (32) and the TOML parser's own (64), which used to surface as an
        // "internal error".
        string text = "[study]\nname = \"deep\"\nx = " + new string('[', 65) + new string(']', 65) + "\n";
        var e = Assert.Throws<InputException>(() => StudyFileParser.Parse(text, "deep.toml", Path.GetTempPath()));
        Assert.Contains("nested more than 32 deep", e.Message);
        Assert.Equal(3, e.Line);
    }

    [Theory]
    [InlineData("csv")]
    [InlineData("fits")]
    [InlineData("vot")]
    [InlineData("parquet")]
    public void DamagedCataloguesThroughTheCliExitTwoOrZeroWithinTheMemoryCeiling(string extension)
    {
        byte[] valid = File.ReadAllBytes(SeedFile(extension));
        var dir = Directory.CreateTempSubdirectory("sizetest-fuzz-cli-").FullName;
        var random = new Random(extension.Length * 7919);
        var failures = new List<string>();
        long worst = 0;
        try
        {
            for (int k = 0; k < 6; k++)
            {
                var (bytes, damage) = Damage(valid, random, extension == "csv" || extension == "vot");
                var path = Path.Combine(dir, $"f{k}.{extension}");
                File.WriteAllBytes(path, bytes);
                var r = CliProcess.Run(dir, ["inspect", path], timeoutSeconds: 60);
                worst = Math.Max(worst, r.PeakRssBytes);
                if (r.Exit is not (0 or 2)) failures.Add($"#{k} ({damage}): exit {r.Exit}: {r.Err.Trim()}");
                if (r.Err.Contains("internal error")) failures.Add($"#{k} ({damage}): {r.Err.Trim()}");
                if (r.Exit == 2 && r.Err.Trim().Split('\n').Length != 1) failures.Add($"#{k} ({damage}): more than one line: {r.Err}");
                if (r.PeakRssBytes > ProcessRssCeilingBytes) failures.Add($"#{k} ({damage}): peak RSS {r.PeakRssBytes >> 20} MiB");
            }
        }
        finally { Directory.Delete(dir, true); }
        output.WriteLine($"{extension}: CLI peak RSS over 6 damaged files {worst >> 20} MiB (ceiling {ProcessRssCeilingBytes >> 20} MiB)");
        Assert.True(failures.Count == 0, string.Join("\n", failures));
    }

    /// <summary>
    /// Loads <paramref name="path"/> in-process as the CLI does: true when it is refused with one
    /// <see cref="InputException"/> (exit 2), false when it is read with every row accounted for. Anything else — another
    /// exception (the CLI's "internal error"), a multi-line message, rows unaccounted for, allocation above
    /// <see cref="AllocationCeilingBytes"/> — is added to <paramref name="failures"/> under <paramref name="label"/>.
    /// </summary>
    internal static bool ReadOrRefuse(string path, string label, List<string> failures, out long allocated)
    {
        bool refused = false;
        long before = GC.GetAllocatedBytesForCurrentThread();
        try
        {
            var load = CatalogueLoader.Load(path, new CatalogueLoadOptions());
            if (load.RowsRead != load.Accepted + load.Rejected)
                failures.Add($"{label}: read {load.RowsRead} ≠ accepted {load.Accepted} + rejected {load.Rejected}");
        }
        catch (InputException e)
        {
            refused = true;
            if (e.Message.Contains('\n')) failures.Add($"{label}: message is not one line: {e.Message}");
        }
        catch (Exception e) when (e is not OutOfMemoryException)
        {
            failures.Add($"{label}: {e.GetType().Name}: {e.Message}");
        }
        catch (OutOfMemoryException e)
        {
            failures.Add($"{label}: out of memory (a damaged size was trusted): {e.Message}");
        }
        allocated = GC.GetAllocatedBytesForCurrentThread() - before;
        if (allocated > AllocationCeilingBytes) failures.Add($"{label}: allocated {allocated / (1 << 20)} MiB");
        return refused;
    }

    /// <summary>One damaged copy of <paramref name="valid"/> and a short description of the damage.</summary>
    internal static (byte[] Bytes, string Damage) Damage(byte[] valid, Random random, bool text)
    {
        var b = new List<byte>(valid);
        int kind = random.Next(6);
        int at = random.Next(b.Count);
        switch (kind)
        {
            case 0:
                int flips = 1 + random.Next(8);
                for (int i = 0; i < flips; i++) { int p = random.Next(b.Count); b[p] = (byte)(b[p] ^ (1 << random.Next(8))); }
                return (b.ToArray(), $"{flips} bit flips");
            case 1:
                return (b.Take(at).ToArray(), $"truncated at {at}");
            case 2:
                int n = 1 + random.Next(64);
                var junk = new byte[n];
                random.NextBytes(junk);
                b.InsertRange(at, junk);
                return (b.ToArray(), $"{n} random bytes inserted at {at}");
            case 3:
                int len = Math.Min(1 + random.Next(256), b.Count - at);
                b.InsertRange(at, b.GetRange(at, len));
                return (b.ToArray(), $"{len} bytes at {at} duplicated");
            case 4:
                int zl = Math.Min(1 + random.Next(64), b.Count - at);
                for (int i = 0; i < zl; i++) b[at + i] = 0;
                return (b.ToArray(), $"{zl} bytes zeroed at {at}");
            default:
                // Digits over a place: in text this makes huge numbers or breaks tokens; in binary headers it makes
                // size fields absurd (FITS cards are ASCII; Parquet/Thrift varints become large).
                string digits = random.Next(3) switch { 0 => "99999999999", 1 => "-1", _ => "2147483648" };
                byte[] d = Encoding.ASCII.GetBytes(text ? digits : digits.PadLeft(20));
                for (int i = 0; i < d.Length && at + i < b.Count; i++) b[at + i] = d[i];
                return (b.ToArray(), $"'{digits}' written at {at}");
        }
    }
}

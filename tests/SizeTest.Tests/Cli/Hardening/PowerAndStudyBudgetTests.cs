using SizeTest.Tests.Studies;
using Xunit;

namespace SizeTest.Tests.Cli.Hardening;

/// <summary>
/// Issue 14 point 5: <c>power --mocks 2e9</c>, a huge power <c>--n</c>, and study files with huge starts or bootstrap
/// resamples grew until the machine ran out of memory. Now their memory is estimated from the settings before
/// anything is allocated and refused with exit 2 and the estimate; nothing is written.
/// </summary>
public sealed class PowerAndStudyBudgetTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-budget-").FullName;

    public void Dispose()
    {
        try { Directory.Delete(_dir, true); } catch (IOException) { }
    }

    [Theory]
    [InlineData("2000000000", "2000", "2000000000 mocks × 1 sample size up to N = 2000")]
    [InlineData("1000", "100000000", "1000 mocks × 1 sample size up to N = 100000000")]
    public void AHugePowerAnalysisIsRefusedBeforeItStarts(string mocks, string n, string named)
    {
        var outDir = Path.Combine(_dir, "p");
        var (exit, _, err, peak) = CliProcess.Run(_dir, ["power", "--mocks", mocks, "--n", n, "--seed", "1", "--out", outDir], timeoutSeconds: 60);
        Assert.Equal(2, exit);
        Assert.Contains(named, err);
        Assert.Contains("memory budget checked before any allocation", err);
        Assert.False(Directory.Exists(outDir));
        Assert.True(peak < 400L << 20, $"peak RSS {peak >> 20} MB");
    }

    [Fact]
    public void PowerMaxMemoryIsALimit()
    {
        // Estimate for 10 mocks of N = 2000 with 4 models (closed form of PowerRequest.EstimatedMemoryBytes):
        // 8·10 + 10·(200 + 16·4 + 160·k) + threads·1000·2000 ≥ 2 MB > 1 MiB for any thread count ≥ 1.
        var (exit, _, err) = CliRunner.Run(["power", "--mocks", "10", "--n", "2000", "--seed", "1", "--out", Path.Combine(_dir, "p"), "--max-memory", "1M"]);
        Assert.Equal(2, exit);
        Assert.Contains("more than --max-memory 1 MB", err);
        // The work is stated as people write a count: 10 mocks × 1 sample size × 4 models = 40 fits (was "4e1 fits").
        Assert.Contains("4 models each: 40 fits)", err);
    }

    [Theory]
    [InlineData("starts = 2000000000", "the optimiser starts (2000000000 starts)")]
    [InlineData("bootstrap = 2000000000", "the bootstrap (2000000000 resamples)")]
    public void AStudyFileWithHugeSettingsIsRefusedBeforeItStarts(string setting, string named)
    {
        var demo = Path.Combine(StudyFileParserTests.RepoRoot(), "demo-catalogs");
        var text = File.ReadAllText(Path.Combine(demo, "demo-study.toml"))
            .Replace("starts = 2", setting.StartsWith("starts", StringComparison.Ordinal) ? setting : "starts = 2", StringComparison.Ordinal)
            .Replace("bootstrap = 0", setting.StartsWith("bootstrap", StringComparison.Ordinal) ? setting : "bootstrap = 0", StringComparison.Ordinal)
            .Replace("\"qdf-optical/", $"\"{demo}/qdf-optical/", StringComparison.Ordinal);
        var study = Path.Combine(_dir, "big.toml");
        File.WriteAllText(study, text);
        var outDir = Path.Combine(_dir, "out");
        var (exit, _, err, peak) = CliProcess.Run(_dir, ["run", study, "--out", outDir], timeoutSeconds: 60);
        Assert.Equal(2, exit);
        Assert.Contains(named, err);
        Assert.False(Directory.Exists(outDir));
        Assert.True(peak < 400L << 20, $"peak RSS {peak >> 20} MB");
    }

    [Fact]
    public void RunMaxMemoryIsALimit()
    {
        // The demo study's own estimate: 2 starts × 24 × 8 B × (k + 1 = 7) × 4 models ≈ 10.5 KB (FitMemoryBudget) — above a 1 KB limit.
        var demo = Path.Combine(StudyFileParserTests.RepoRoot(), "demo-catalogs", "demo-study.toml");
        var outDir = Path.Combine(_dir, "out");
        var (exit, _, err) = CliRunner.Run(["run", demo, "--out", outDir, "--max-memory", "1K"]);
        Assert.Equal(2, exit);
        Assert.Contains("the optimiser starts (2 starts)", err);
        Assert.Contains("more than --max-memory 1 KB", err);
        Assert.False(Directory.Exists(outDir));
    }
}

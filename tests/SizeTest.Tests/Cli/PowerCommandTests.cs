using SizeTest.Simulation;
using SizeTest.Tests.Catalogues;
using SizeTest.Tests.Simulation;
using Xunit;

namespace SizeTest.Tests.Cli;

/// <summary><c>sizetest power</c> through the real CLI and files.</summary>
public sealed class PowerCommandTests
{
    [Fact]
    public void WritesJsonAndCsvAndPrintsTheTable()
    {
        using var tmp = new TempFiles();
        string dir = tmp.PathOf("power");
        var (code, stdout, err) = CliRunner.Run("power", "--n", "30,60", "--mocks", "4", "--seed", "2", "--models", "lcdm,tired-light",
            "--observable", "size", "--size-evolution", "0", "--fix", "size_evolution=0", "--out", dir);
        Assert.True(code == 0, err);
        Assert.Contains("Conclusion:", stdout);
        Assert.Contains("mocks fitted", err); // plain progress lines when not on a terminal
        var result = PowerResultFiles.ReadJson(File.ReadAllText(Path.Combine(dir, "power.json")));
        Assert.True(result.Synthetic);
        Assert.Equal([30, 60], result.Points.Select(p => p.SampleSize));
        Assert.Equal(8, result.Outcomes.Count);
        var csv = File.ReadAllLines(Path.Combine(dir, "power.csv"));
        Assert.Equal(3, csv.Length);
        Assert.StartsWith("n,mocks,p_true_best,p_delta_bic_gt_6,p_delta_bic_gt_10", csv[0]);
        Assert.Equal(9, File.ReadAllLines(Path.Combine(dir, "mocks.csv")).Length);

        var again = CliRunner.Run("power", "--n", "30", "--mocks", "2", "--seed", "2", "--models", "lcdm,tired-light", "--out", dir);
        Assert.Equal(2, again.Exit);
        Assert.Contains("--force", again.Err);
    }

    [Theory]
    [InlineData("--models", "lcdm")]
    [InlineData("--models", "eds,tired-light")]
    [InlineData("--n", "5")]
    [InlineData("--fix", "no_such=1")]
    [InlineData("--free", "omega_m", "--fix", "omega_m=0.3")]
    [InlineData("--kind", "radio", "--observable", "joint")]
    public void BadRequestsExitTwo(params string[] extra)
    {
        using var tmp = new TempFiles();
        var (code, _, err) = CliRunner.Run([.. new[] { "power", "--mocks", "2", "--seed", "1", "--out", tmp.PathOf("p") }, .. extra]);
        Assert.Equal(2, code);
        Assert.Single(err.Trim().Split('\n'));
    }
}

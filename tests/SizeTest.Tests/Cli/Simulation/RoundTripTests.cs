using SizeTest.Inference;
using SizeTest.Tests.Catalogues;
using Xunit;

namespace SizeTest.Tests.Cli.Simulation;

/// <summary>simulate → fit through the real CLI and files recovers the truth.</summary>
public sealed class RoundTripTests
{
    private static void Within4Sigma(ModelFitSummary m, string name, double truth)
    {
        var p = m.Parameters.Single(x => x.Name == name);
        double sigma = 0.5 * (p.Hi - p.Lo);
        Assert.True(sigma > 0, $"{name} has no interval");
        Assert.True(Math.Abs(p.Value - truth) < 4 * sigma, $"{name} = {p.Value} ± {sigma}, truth {truth}"); // MLE within 4σ of the truth (common practice)
    }

    [Fact]
    [Trait("Category", "Slow")]
    public void SimulatedGalaxiesFitBackToTheirTruth()
    {
        using var tmp = new TempFiles();
        string cat = tmp.PathOf("mock.csv"), dir = tmp.PathOf("fit");
        var sim = CliRunner.Run("simulate", "--model", "lcdm", "--n", "3000", "--seed", "77", "--r0-kpc", "4", "--size-evolution", "-1.2", "--scatter-dex", "0.2",
            "--mu0", "21.5", "--sb-evolution", "1.5", "--scatter-mag", "0.3", "--sb-limit", "25", "--out", cat);
        Assert.True(sim.Exit == 0, sim.Err);
        var fit = CliRunner.Run("fit", cat, "--models", "lcdm,tired-light", "--observable", "joint", "--sb-limit", "25", "--cv-folds", "0", "--out", dir);
        Assert.True(fit.Exit == 0, fit.Err);
        var result = ResultsJson.Deserialize(File.ReadAllText(Path.Combine(dir, "results.json")));
        Assert.Equal(3000, result.Accepted);
        var lcdm = result.Models.Single(m => m.Name == "lcdm");
        Assert.True(lcdm.Converged);
        Within4Sigma(lcdm, "r0_kpc", 4);
        Within4Sigma(lcdm, "size_evolution", -1.2);
        Within4Sigma(lcdm, "scatter_dex", 0.2);
        Within4Sigma(lcdm, "mu0", 21.5);
        Within4Sigma(lcdm, "sb_evolution", 1.5);
        Within4Sigma(lcdm, "scatter_mag", 0.3);
        // Tired light (n = 1) must absorb the Tolman signal 2.5·(4 − 1.5)·log10(1+z) with b = 1 − 2.5 = −1.5 (closed form n − b equal).
        var tl = result.Models.Single(m => m.Name == "tired-light");
        var b = tl.Parameters.Single(x => x.Name == "sb_evolution");
        Assert.InRange(b.Value, -1.5 - 4 * 0.5 * (b.Hi - b.Lo), -1.5 + 4 * 0.5 * (b.Hi - b.Lo));
    }

    [Fact]
    public void SimulatedRadioSourcesFitBackToTheRod()
    {
        using var tmp = new TempFiles();
        string cat = tmp.PathOf("radio.fits"), dir = tmp.PathOf("fit");
        Assert.Equal(0, CliRunner.Run("simulate", "--kind", "radio", "--n", "400", "--seed", "3", "--z-dist", "uniform:0.5:3", "--scatter-dex", "0.1", "--out", cat).Exit);
        var fit = CliRunner.Run("fit", cat, "--models", "lcdm", "--observable", "size", "--cv-folds", "0", "--out", dir);
        Assert.True(fit.Exit == 0, fit.Err);
        var lcdm = ResultsJson.Deserialize(File.ReadAllText(Path.Combine(dir, "results.json"))).Models.Single();
        Within4Sigma(lcdm, "r0_kpc", 0.01103); // ℓ_m = 11.03 pc (Cao et al. 2017) = 0.01103 kpc
        Within4Sigma(lcdm, "size_evolution", 0);
        Within4Sigma(lcdm, "scatter_dex", 0.1);
    }
}

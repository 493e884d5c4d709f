using SizeTest.Tests.Inference;
using System.Globalization;
using System.Text;
using SizeTest.Inference;
using Xunit;
using SizeTest.Foundation.Angles;

namespace SizeTest.Tests.Cli.Inference;

/// <summary><c>--steps auto</c> (the default): the ensemble sampler runs in blocks until the convergence rules hold
/// (≥ 50 τ, split-R̂ ≤ 1.01, ESS ≥ 400: <see cref="SizeTest.Inference.Sampling.ConvergenceCriteria"/>) or --max-steps.</summary>
public sealed class AutoStepsTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-auto-").FullName;

    public void Dispose()
    {
        try { Directory.Delete(_dir, true); } catch (IOException) { }
    }

    // A synthetic (mock) catalogue: EdS, R0 = 4 kpc, a = −1, 0.2 dex (MockCatalogue defaults), seeded.
    private string Catalogue(int n = 300, int seed = 5)
    {
        var obs = MockCatalogue.Draw(TestWorldModels.Eds.Create(new Dictionary<string, double>()), n, new MockCatalogue.Truth(), seed);
        var sb = new StringBuilder("z,theta,theta_err\n");
        for (int i = 0; i < obs.Count; i++)
        {
            double th = Math.Exp(obs.LnTheta![i]) * AngleUnits.ArcsecPerRadian;
            sb.Append(CultureInfo.InvariantCulture, $"{obs.Z[i]:R},{th:R},{0.05 * th:R}\n");
        }
        var path = Path.Combine(_dir, "mock.csv");
        File.WriteAllText(path, sb.ToString());
        return path;
    }

    private static FitResult Results(string folder) => ResultsJson.Deserialize(File.ReadAllText(Path.Combine(folder, "results.json")));

    [Fact]
    public void AutoStepsRunsUntilTheRulesHoldAndStops()
    {
        var cat = Catalogue();
        var out1 = Path.Combine(_dir, "auto");
        var (exit, _, err) = CliRunner.Run("fit", cat, "--models", "eds", "--cv-folds", "0", "--sampler", "mcmc", "--walkers", "16", "--out", out1);
        Assert.True(exit == 0, err);
        var c = Results(out1).Chains.Single();
        Assert.True(c.Auto && c.Converged);
        // The rules themselves, re-read from the output (ConvergenceCriteria defaults; Vehtari et al. 2021 for R̂/ESS).
        Assert.True(c.LengthInTau >= 50, $"{c.LengthInTau} τ");
        Assert.True(c.MaxRhat <= 1.01, $"R̂ {c.MaxRhat}");
        Assert.True(c.MinEss >= 400, $"ESS {c.MinEss}");
        // It stopped once they held: well before the cap, and the kept length is steps − floor(steps/4).
        Assert.True(c.Steps < c.MaxSteps, $"{c.Steps} steps");
        Assert.Equal(c.Steps / 4, c.BurnIn);
        Assert.Equal(16 * c.Steps, File.ReadAllLines(Path.Combine(out1, "chains_eds.csv")).Length - 1);
    }

    [Fact]
    public void TooFewMaxStepsIsNotConvergedExitOneWithTheNumbers()
    {
        var cat = Catalogue();
        var out1 = Path.Combine(_dir, "short");
        var (exit, _, err) = CliRunner.Run("fit", cat, "--models", "eds", "--cv-folds", "0", "--sampler", "mcmc", "--walkers", "16", "--max-steps", "120", "--out", out1);
        Assert.Equal(1, exit);
        Assert.Contains("not converged within the limit of 120 steps", err);
        Assert.Contains("τ", err); // the numbers of the failed rules are stated
        var c = Results(out1).Chains.Single();
        Assert.Equal((120, false, true), (c.Steps, c.Converged, c.Auto));
    }

    [Fact]
    public void AChainBeyondTheMemoryBudgetIsRefusedBeforeAnyWork()
    {
        var cat = Catalogue(50);
        var out1 = Path.Combine(_dir, "big");
        // 100 000 walkers × 1 000 000 steps × (3 + 1) × 8 B ≈ 3 TB, far beyond the 2 GiB budget.
        var (exit, _, err) = CliRunner.Run("fit", cat, "--models", "eds", "--cv-folds", "0", "--sampler", "mcmc", "--walkers", "100000", "--max-steps", "1000000", "--out", out1);
        Assert.Equal(2, exit);
        Assert.Contains("budget", err);
        Assert.False(Directory.Exists(out1));
        (exit, _, err) = CliRunner.Run("fit", cat, "--models", "eds", "--sampler", "mcmc", "--steps", "lots", "--out", out1);
        Assert.Equal(2, exit);
        Assert.Contains("--steps must be auto", err);
    }
}

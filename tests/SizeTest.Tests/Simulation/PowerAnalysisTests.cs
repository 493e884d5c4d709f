using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Simulation;
using Xunit;

namespace SizeTest.Tests.Simulation;

/// <summary>The power analysis through the real maximum-likelihood fitter.</summary>
public sealed class PowerAnalysisTests
{
    private static readonly IWorldModel Lcdm = WorldModels.Get("lcdm").Create(new Dictionary<string, double>());

    private static PowerRequest Request(RedshiftDistribution z, int mocks, int[] sizes, GalaxyPopulation g, string[] models, ParameterOverrides? o = null, int? threads = null, long seed = 5) =>
        new(new MockSurveySpec(Lcdm, new SurveyDesign(sizes.Max(), z), seed, g),
            models.Select(m => Hypothesis.Create(WorldModels.Get(m), new NuisanceModel(ObservableKind.Size), o)).ToArray(),
            "lcdm", mocks, sizes, MaxThreads: threads);

    [Fact]
    public void PowerIsMonotoneInSampleSizeOnAFixedSeedSet()
    {
        // No size evolution in the truth and none allowed in the fits: the angular-size–redshift shape alone separates
        // ΛCDM from tired light, so ΔBIC grows roughly in proportion to N.
        var r = PowerAnalysis.Run(Request(RedshiftDistribution.Uniform(0.1, 3), 20, [10, 20, 40, 80], new GalaxyPopulation(SizeEvolution: 0),
            ["lcdm", "tired-light"], new ParameterOverrides(Fixed: new Dictionary<string, double> { ["size_evolution"] = 0 })));
        var p6 = r.Points.Select(p => p.ProbabilityStrong).ToArray();
        var p10 = r.Points.Select(p => p.ProbabilityDecisive).ToArray();
        for (int i = 1; i < p6.Length; i++)
        {
            Assert.True(p6[i] >= p6[i - 1], $"P(ΔBIC>6) fell from {p6[i - 1]} to {p6[i]} at N = {r.Points[i].SampleSize}");
            Assert.True(p10[i] >= p10[i - 1], $"P(ΔBIC>10) fell from {p10[i - 1]} to {p10[i]} at N = {r.Points[i].SampleSize}");
        }
        Assert.True(p10[^1] > p10[0], "power must actually grow over a 8× range of N");
        Assert.Equal(80, r.RequiredSampleSize ?? 80);
        Assert.True(r.Points[^1].DeltaBicQuantiles[2] > r.Points[0].DeltaBicQuantiles[2]);
    }

    [Fact]
    public void ADesignWithNoRedshiftLeverageIsReportedAsUnableToDecide()
    {
        var r = PowerAnalysis.Run(Request(RedshiftDistribution.Uniform(0.50, 0.52), 10, [500], new GalaxyPopulation(), ["lcdm", "tired-light"]));
        Assert.Null(r.RequiredSampleSize);
        Assert.Equal("unable to decide", r.Points[0].Verdict);
        Assert.StartsWith("unable to decide", r.Conclusion);
        Assert.Equal(0, r.Points[0].ProbabilityStrong);
    }

    [Fact]
    public void ResultsDoNotDependOnTheNumberOfThreads()
    {
        var g = new GalaxyPopulation();
        var one = PowerAnalysis.Run(Request(RedshiftDistribution.Uniform(0.1, 3), 6, [100, 200], g, ["lcdm", "eds"], threads: 1));
        var two = PowerAnalysis.Run(Request(RedshiftDistribution.Uniform(0.1, 3), 6, [100, 200], g, ["lcdm", "eds"], threads: 2));
        Assert.Equal(one.Outcomes.Select(o => BitConverter.DoubleToInt64Bits(o.DeltaBic)), two.Outcomes.Select(o => BitConverter.DoubleToInt64Bits(o.DeltaBic)));
        Assert.Equal(PowerResultFiles.Json(one), PowerResultFiles.Json(two));
    }

    [Fact]
    [Trait("Category", "Slow")]
    public void EvolutionExponentIsRecoveredWithoutBiasAndNominalCoverage()
    {
        var g = new GalaxyPopulation(SizeEvolution: -1.0, ScatterDex: 0.2);
        var r = PowerAnalysis.Run(Request(RedshiftDistribution.Uniform(0.1, 3), 60, [400], g, ["lcdm", "tired-light"]));
        var a = r.Points[0].Recovery.Single(x => x.Name == "size_evolution");
        Assert.Equal(-1.0, a.Truth);
        Assert.True(Math.Abs(a.Bias) < 4 * a.BiasError, $"bias {a.Bias} ± {a.BiasError}"); // unbiased MLE at this N: |bias| < 4 standard errors
        // Hessian ±1σ intervals should cover the truth in 68.3% of mocks; binomial 4σ band for 60 mocks (common practice).
        double sd = Math.Sqrt(0.683 * 0.317 / a.CoverageCount);
        Assert.InRange(a.Coverage, 0.683 - 4 * sd, 0.683 + 4 * sd);
        // The reported errors should match the spread of the estimates (to 30% with 60 mocks; sampling error of an sd ≈ 9%).
        Assert.InRange(a.MedianError / a.Spread, 0.7, 1.3);
    }
}

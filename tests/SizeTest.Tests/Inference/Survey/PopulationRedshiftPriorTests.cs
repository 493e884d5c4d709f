using SizeTest.Cosmology;
using MathNet.Numerics.Distributions;
using SizeTest.Foundation.Randomness;
using SizeTest.Inference.Survey;
using SizeTest.Simulation;
using Xunit;
using static SizeTest.Tests.Inference.Survey.SurveyFitting;

namespace SizeTest.Tests.Inference.Survey;

/// <summary>
/// The population redshift prior of the photo-z marginalisation: the deconvolution itself against a closed form, and the bias of a
/// flat prior over the observed range that it removes (injection–recovery, the CLI's default path through <see cref="SurveyRequest.Build"/>).
/// </summary>
public sealed class PopulationRedshiftPriorTests(Xunit.Abstractions.ITestOutputHelper output)
{
    [Fact]
    public void TheDeconvolvedPriorHasThePopulationsVarianceNotTheObservedOne()
    {
        // True z ~ N(1.5, 0.3²), observed with σ = 0.2: the observed z have variance 0.3² + 0.2² = 0.13 (variances of independent
        // sums add, closed form); the deconvolved prior should have the population's 0.09. Its variance is Σ p_k (c_k − m)² + s²
        // (mixture of N(c_k, s²)). 5000 objects: the sample variance of the truth alone has a relative standard error
        // √(2/5000) = 2%, the deconvolution more; ±15% of 0.09 still excludes 0.13 (from memory: the NPMLE of a mixing distribution
        // is consistent but converges slowly).
        var rng = SeededRandom.Create(5);
        int n = 5000;
        var z = new double[n];
        var e = new double[n];
        for (int i = 0; i < n; i++)
        {
            z[i] = 1.5 + 0.3 * Normal.Sample(rng, 0, 1) + 0.2 * Normal.Sample(rng, 0, 1);
            e[i] = 0.2;
        }
        var prior = PopulationRedshiftPrior.Estimate(z, e, z.Min(), z.Max());
        double mean = 0, var = 0;
        for (int k = 0; k < prior.Centres.Count; k++) mean += prior.Weights[k] * prior.Centres[k];
        for (int k = 0; k < prior.Centres.Count; k++) var += prior.Weights[k] * Math.Pow(prior.Centres[k] - mean, 2);
        var += prior.Width * prior.Width;
        output.WriteLine($"K = {prior.Centres.Count}, s = {prior.Width:G4}, {prior.Iterations} EM steps: mean {mean:F4}, variance {var:F4} (population 0.09, observed 0.13)");
        Assert.InRange(mean, 1.48, 1.52);
        Assert.InRange(var, 0.09 * 0.85, 0.09 * 1.15);
        Assert.Equal(1.0, prior.Weights.Sum(), 12);
    }

    [Fact]
    public void APriorRangeAwayFromEveryObjectLeavesTheWeightsFlatNotUndefined()
    {
        // Every N(z_i; c_k, s² + σ²) underflows to 0 (z ≈ 1, σ = 0.01, range [5, 6]): EM has no information, so the weights must
        // stay at their flat start 1/K (closed form) instead of 0/0.
        var prior = PopulationRedshiftPrior.Estimate([1.0, 1.1, 0.9], [0.01, 0.01, 0.01], 5, 6);
        Assert.All(prior.Weights, w => Assert.Equal(1.0 / prior.Weights.Count, w, 12));
        Assert.True(double.IsFinite(prior.LogDensity(5.5)));
    }

    private static (double Population, double Flat) FitBoth(long seed, int n)
    {
        // z_true uniform on [0.5, 3], σ_z = 0.05 (1+z), 5% log-normal size errors, no stated prior: the range is the observed one.
        var obs = Draw(Lcdm, n, seed, "uniform:0.5:3", errors: new MeasurementErrors(0.05, MuErrorMag: 0, PhotoZError: 0.05)).ToObservables();
        double A(RedshiftPriorShape shape)
        {
            var model = new SurveyRequest(RedshiftPriorShape: shape).Build(obs, SizeTest.Inference.ObservableKind.Size, new List<string>());
            Assert.True(model.MarginaliseRedshift);
            Assert.Equal(shape == RedshiftPriorShape.Population, model.RedshiftPopulation is not null);
            return Est(Fit(WorldModels.LambdaCdm, obs, model).Summary, "size_evolution").Value;
        }
        return (A(RedshiftPriorShape.Population), A(RedshiftPriorShape.Flat));
    }

    [Fact]
    public void APriorFlatOverTheObservedRangeBiasesTheEvolutionAndThePopulationPriorRemovesIt()
    {
        // Measured with the CLI over 30 mocks of 1500 objects (this design): flat a = −0.954 (40 mocks), population a = −0.989,
        // per-mock σ_a = 0.043. Here 24 mocks: the standard error of the mean is 0.043/√24 = 0.009, so |mean + 1| < 0.025 is ±2.8 SE
        // for the population prior, and a flat-prior mean above −0.975 shows its bias (+0.046 measured; 0.025 is 2.3 SE below that).
        int m = 24;
        double pop = 0, flat = 0;
        for (int k = 0; k < m; k++)
        {
            var (p, f) = FitBoth(500 + k, 1500);
            pop += p / m;
            flat += f / m;
        }
        output.WriteLine($"mean a over {m} mocks: population prior {pop:F4}, flat prior over the observed range {flat:F4} (truth −1)");
        Assert.InRange(pop, -1.025, -0.975);
        Assert.True(flat > -0.975, $"the flat prior's mean a = {flat:F4} should be biased high");
    }

    [Fact]
    public void DefaultPriorIntervalsCoverTheTruthAtTheirNominalRate()
    {
        // The CLI's default path (population prior, range the observed one) over 100 mocks of 400 objects of the design above:
        // coverage of the 68.3% Hessian interval of a; the binomial standard error is √(0.683·0.317/100) = 0.047, so 61–75% is the
        // ±1.5σ band issue 12 asks for (common practice). Measured with the CLI at 1500 objects: 63% (30 mocks; flat prior 45%).
        int hits = 0, m = 100;
        for (int k = 0; k < m; k++)
        {
            var obs = Draw(Lcdm, 400, 2000 + k, "uniform:0.5:3", errors: new MeasurementErrors(0.05, MuErrorMag: 0, PhotoZError: 0.05)).ToObservables();
            var model = new SurveyRequest().Build(obs, SizeTest.Inference.ObservableKind.Size, new List<string>());
            if (Within(Est(Fit(WorldModels.LambdaCdm, obs, model).Summary, "size_evolution"), -1.0)) hits++;
        }
        output.WriteLine($"coverage over {m} mocks with the population prior: {hits}%");
        Assert.InRange(hits / (double)m, 0.61, 0.75);
    }
}

using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Simulation;
using Xunit;

namespace SizeTest.Tests.Inference.Intervals;

/// <summary>interval_method, automatic profile intervals and "at bound" (issue 11 item 5, issue 14 identifiability).</summary>
public sealed class HonestIntervalTests
{
    private static readonly IWorldModel Eds = WorldModels.EinsteinDeSitter.Create(new Dictionary<string, double>());

    [Fact]
    public void ANearlyGaussianFitKeepsTheHessianIntervals()
    {
        // Sizes with cosmology fixed: ln θ is linear in ln R0 and a, so the profiles of r0_kpc and size_evolution are
        // close to quadratic at N = 2000 and the two-point screen keeps the Hessian (a closed-form argument: a Gaussian
        // linear model's profile is exactly quadratic in the linear parameters).
        var obs = MockCatalogue.Draw(Eds, 2000, new MockCatalogue.Truth(), seed: 8);
        var h = Hypothesis.Create(WorldModels.EinsteinDeSitter, new NuisanceModel(ObservableKind.Size));
        var lik = h.Bind(obs);
        var refined = ModelFitRefinement.Run(lik, obs, MaximumLikelihood.Fit(lik));
        Assert.Equal(IntervalMethods.Hessian, refined.Summary.Parameters.First(p => p.Name == "size_evolution").IntervalMethod);
        Assert.All(refined.Summary.Parameters.Where(p => p.Fixed), p => Assert.Equal(IntervalMethods.Fixed, p.IntervalMethod));
        Assert.Empty(refined.Summary.Modes);
    }

    [Fact]
    public void AParameterPinnedAtABoundGetsAOneSidedProfileInterval()
    {
        // Truth a = −1, but a is bounded to [0, 2]: the maximum sits on the lower bound.
        var obs = MockCatalogue.Draw(Eds, 500, new MockCatalogue.Truth(), seed: 5);
        var h = Hypothesis.Create(WorldModels.EinsteinDeSitter, new NuisanceModel(ObservableKind.Size),
            new ParameterOverrides(Bounds: new Dictionary<string, (double, double)> { ["size_evolution"] = (0, 2) }));
        var lik = h.Bind(obs);
        var refined = ModelFitRefinement.Run(lik, obs, MaximumLikelihood.Fit(lik));
        var a = refined.Summary.Parameters.First(p => p.Name == "size_evolution");
        Assert.Equal("lower", a.AtBound);
        Assert.Equal(IntervalMethods.Profile, a.IntervalMethod);
        Assert.Equal(0.0, a.Lo);
        Assert.True(a.Hi > 0, $"upper end {a.Hi}");
        // The upper end is the Δ ln L = ½ crossing: refit there and check the drop (bisection to 1/32 of the first step,
        // then linear interpolation: the drop is ½ within 0.02).
        var at = new ProfileRefit(h, obs, "size_evolution").At(a.Hi, refined.Best.Theta);
        Assert.InRange(refined.Best.LogLikelihood - at.LogLikelihood, 0.48, 0.52);
        Assert.Contains(refined.Notes, n => n.Contains("lower bound", StringComparison.Ordinal));
    }

    [Fact]
    public void ReportedIntervalsCoverTheTruthAtTheNominalRateWithOmegaMFree()
    {
        // Issue 11: mocks of 2000 galaxies, flat ΛCDM Ωm = 0.3, fitted with omega_m free; the reported 68% sets must
        // cover the truth 61–75% of the time. The full 200-mock run is the benchmark
        // `--interval-coverage 200` (tests/SizeTest.Benchmarks/IntervalCoverageHarness.cs, same seed and design); here
        // the first 40 mocks. Binomial s.d. at p = 0.683, K = 40: √(0.683·0.317/40) = 0.074; the band is ±3 s.d. around
        // the nominal rate, [0.46, 0.90] → 19..36 of 40. Before this change the plain Hessian intervals covered 38–41%
        // (issue 11), i.e. ~16 of 40, outside the band.
        var model = WorldModels.LambdaCdm.Create(new Dictionary<string, double> { ["omega_m"] = 0.3 });
        var template = new MockSurveySpec(model, new SurveyDesign(2000, RedshiftDistribution.Uniform(0.1, 3)), 20261202);
        var h = Hypothesis.Create(WorldModels.LambdaCdm, new NuisanceModel(ObservableKind.Size), new ParameterOverrides(Free: new HashSet<string> { "omega_m" }));
        var truth = new Dictionary<string, double> { ["omega_m"] = 0.3, ["size_evolution"] = -1.0 };
        var r = IntervalCoverageStudy.Run(template, h, truth, 40, 20261202);
        foreach (var c in r.Parameters)
            Assert.True(c.Covered is >= 19 and <= 36, $"{c.Name}: {c.Covered}/40 covered (hull {c.HullCovered}, plain Hessian {c.HessianCovered})");
    }
}

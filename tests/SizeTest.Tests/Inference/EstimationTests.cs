using SizeTest.Inference;
using Xunit;

namespace SizeTest.Tests.Inference;

public sealed class EstimationTests(Xunit.Abstractions.ITestOutputHelper output)
{
    private static readonly IReadOnlyDictionary<string, double> Defaults = new Dictionary<string, double>();

    private static double Value(ModelFitSummary s, string name) => s.Parameters.Single(p => p.Name == name).Value;
    private static ParameterEstimate Est(ModelFitSummary s, string name) => s.Parameters.Single(p => p.Name == name);

    [Fact]
    public void SizeFitRecoversInjectedParameters()
    {
        // Truth: R0 = 4 kpc, a = −1, σ = 0.2 dex in EdS (synthetic mock, MockCatalogue). Within 3σ of the Hessian
        // errors (a 3σ miss has probability 0.3%; the seed is fixed) and the Hessian errors are sane.
        var truth = new MockCatalogue.Truth();
        var obs = MockCatalogue.Draw(TestWorldModels.Eds.Create(Defaults), 2000, truth, seed: 21);
        var lik = Hypothesis.Create(TestWorldModels.Eds, new NuisanceModel(ObservableKind.Size)).Bind(obs);
        var fit = MaximumLikelihood.Fit(lik);
        Assert.True(fit.Converged, fit.ExitReason.Text);
        var s = FitSummaries.From(lik, fit);
        foreach (var (name, t) in new[] { ("r0_kpc", truth.R0Kpc), ("size_evolution", truth.SizeEvolution), ("scatter_dex", truth.ScatterDex) })
        {
            var e = Est(s, name);
            double sigma = (e.Hi - e.Lo) / 2;
            Assert.InRange(t, e.Value - 3 * sigma, e.Value + 3 * sigma);
        }
        // Expected σ(a) for n = 2000, σ_ln = 0.46+: σ_a ≈ σ_ln/(√n · sd(ln(1+z))) ≈ 0.47/(44.7 · 0.3) ≈ 0.035 (least squares, derived).
        var a = Est(s, "size_evolution");
        Assert.InRange((a.Hi - a.Lo) / 2, 0.02, 0.06);
    }

    [Fact]
    public void JointFitWithKormendyRelationRecoversSbEvolutionAtFixedSize()
    {
        var truth = new MockCatalogue.Truth(Kormendy: 3.0, SbEvolution: 1.2);
        var obs = MockCatalogue.Draw(TestWorldModels.Eds.Create(Defaults), 3000, truth, seed: 8);
        var lik = Hypothesis.Create(TestWorldModels.Eds, new NuisanceModel(ObservableKind.Joint, SizeSbRelation: true)).Bind(obs);
        var fit = MaximumLikelihood.Fit(lik);
        Assert.True(fit.Converged, fit.ExitReason.Text);
        var s = FitSummaries.From(lik, fit);
        foreach (var (name, t) in new[] { ("sb_evolution", 1.2), ("kormendy_slope", 3.0), ("size_evolution", -1.0), ("mu0", 21.0) })
        {
            var e = Est(s, name);
            Assert.InRange(t, e.Value - 3 * (e.Hi - e.Lo) / 2, e.Value + 3 * (e.Hi - e.Lo) / 2); // 3σ (common practice)
        }
    }

    [Fact]
    public void ComparisonPicksTheTrueWorldModel()
    {
        // Mock from EdS with a = −1; a static d = cz/H0 model mimics much of it with size evolution (at n = 2000 and
        // 0.1 < z < 3 with 0.2 dex scatter the two differ by only ΔBIC ≈ 1), but not the curvature of ln θ(z) over
        // 0.05 < z < 5 at n = 10⁴ with 0.08 dex scatter (Δχ² grows as n/σ²; measured here ΔBIC ≫ 10).
        var obs = MockCatalogue.Draw(TestWorldModels.Eds.Create(Defaults), 10000, new MockCatalogue.Truth(ScatterDex: 0.08), seed: 4, zMin: 0.05, zMax: 5, lnThetaErr: 0.02);
        var nm = new NuisanceModel(ObservableKind.Size);
        var result = FitRun.Run(new FitRequest
        {
            Hypotheses = [Hypothesis.Create(TestWorldModels.StaticLinear, nm), Hypothesis.Create(TestWorldModels.Eds, nm)],
            Observables = obs,
        });
        Assert.Equal("eds", result.Models[0].Name);
        Assert.True(result.Models[1].DeltaBic > 10, $"ΔBIC = {result.Models[1].DeltaBic}"); // "very strong" (Kass & Raftery 1995)
        Assert.Equal("very strong", result.BayesFactors[0].Strength);
        Assert.True(result.AllConverged);
        // Both models need size evolution; the LRT against a = 0 rejects it strongly for EdS (truth a = −1).
        var lrt = result.LikelihoodRatioTests.Single(t => t.Model == "eds");
        Assert.True(lrt.PValue < 1e-10);
        Assert.Contains("needs size evolution", lrt.Statement);
    }

    [Fact]
    public void NoEvolutionMockIsNotFlaggedAsNeedingEvolution()
    {
        var obs = MockCatalogue.Draw(TestWorldModels.Eds.Create(Defaults), 500, new MockCatalogue.Truth(SizeEvolution: 0), seed: 99);
        var r = FitRun.Run(new FitRequest
        {
            Hypotheses = [Hypothesis.Create(TestWorldModels.Eds, new NuisanceModel(ObservableKind.Size))],
            Observables = obs,
            Expected = [new ExpectedRange("size_evolution", -1.5, -0.7)],
        });
        var req = r.RequiredEvolution.Single();
        // With seed 99 the LRT p is well above 0.05 (a is 0 in truth; a false alarm has 5% probability).
        Assert.False(req.ZeroExcluded, req.Verdict);
        Assert.Contains("lies outside the expected", req.Verdict);
    }

    [Fact]
    public void IgnoringAMinimumSizeCutBiasesTheEvolutionAndModellingItRemovesTheBias()
    {
        // Truth a = −1 in EdS; keep only θ > 0.35″ (resolution limit), which removes small high-z objects.
        double thetaMin = 0.35;
        double lnMin = Math.Log(thetaMin * SizeTest.Foundation.Angles.AngleUnits.RadiansPerArcsec);
        var obs = MockCatalogue.Draw(TestWorldModels.Eds.Create(Defaults), 3000, new MockCatalogue.Truth(), seed: 17,
            keep: (z, lnTheta, mu) => lnTheta > lnMin);
        double Fit(NuisanceModel nm)
        {
            var lik = Hypothesis.Create(TestWorldModels.Eds, nm).Bind(obs);
            var f = MaximumLikelihood.Fit(lik);
            Assert.True(f.Converged, f.ExitReason.Text);
            return FitSummaries.From(lik, f).Parameters.Single(p => p.Name == "size_evolution").Value;
        }
        double naive = Fit(new NuisanceModel(ObservableKind.Size));
        double modelled = Fit(new NuisanceModel(ObservableKind.Size, new SelectionLimits(MinThetaArcsec: thetaMin)));
        // Ignoring the cut flattens the decline (a biased high by ≫ σ_a ≈ 0.04); modelling it recovers a = −1 within 3σ.
        Assert.True(naive > -0.8, $"naive a = {naive}");
        Assert.InRange(modelled, -1.15, -0.85);
    }

    [Fact]
    public void IgnoringASurfaceBrightnessLimitBiasesTheTolmanFitAndModellingItRemovesTheBias()
    {
        // Truth b = 1 (EdS, n = 4); keep μ < 23.5, which removes faint high-z objects.
        var obs = MockCatalogue.Draw(TestWorldModels.Eds.Create(Defaults), 3000, new MockCatalogue.Truth(), seed: 23,
            keep: (z, lnTheta, mu) => mu < 23.5);
        double Fit(NuisanceModel nm)
        {
            var lik = Hypothesis.Create(TestWorldModels.Eds, nm).Bind(obs);
            var f = MaximumLikelihood.Fit(lik);
            Assert.True(f.Converged, f.ExitReason.Text);
            return FitSummaries.From(lik, f).Parameters.Single(p => p.Name == "sb_evolution").Value;
        }
        double naive = Fit(new NuisanceModel(ObservableKind.SurfaceBrightness));
        double modelled = Fit(new NuisanceModel(ObservableKind.SurfaceBrightness, new SelectionLimits(SbLimit: 23.5)));
        Assert.True(naive > 1.3, $"naive b = {naive}");   // biased towards "brighter in the past"
        Assert.InRange(modelled, 0.8, 1.2);               // truth 1 within ~3σ (σ_b ≈ 0.06, derived as for a)
    }

    [Fact]
    public void JointTruncationWithTwoCutsRecoversTruth()
    {
        double thetaMin = 0.3, sbLim = 24.0;
        double lnMin = Math.Log(thetaMin * SizeTest.Foundation.Angles.AngleUnits.RadiansPerArcsec);
        var truth = new MockCatalogue.Truth(Kormendy: 2.5);
        var obs = MockCatalogue.Draw(TestWorldModels.Eds.Create(Defaults), 3000, truth, seed: 31,
            keep: (z, lnTheta, mu) => lnTheta > lnMin && mu < sbLim);
        var lik = Hypothesis.Create(TestWorldModels.Eds, new NuisanceModel(ObservableKind.Joint, new SelectionLimits(SbLimit: sbLim, MinThetaArcsec: thetaMin), SizeSbRelation: true)).Bind(obs);
        var f = MaximumLikelihood.Fit(lik);
        Assert.True(f.Converged, f.ExitReason.Text);
        var s = FitSummaries.From(lik, f);
        foreach (var (name, t) in new[] { ("size_evolution", -1.0), ("sb_evolution", 1.0), ("kormendy_slope", 2.5) })
        {
            var e = Est(s, name);
            Assert.InRange(t, e.Value - 3.5 * (e.Hi - e.Lo) / 2, e.Value + 3.5 * (e.Hi - e.Lo) / 2); // bivariate truncation (Genz 2004 Φ₂) unbiased within 3.5σ
        }
    }

    [Fact]
    public void MagnitudeLimitIsModelledInJointMode()
    {
        // m = μ − 5 log10(θ/″) − 2.5 log10(2π) (mean SB inside the half-light radius; SelectionLimits docs).
        double mLim = 22.0;
        double Mag(double lnTheta, double mu) => mu - 5 * Math.Log10(Math.Exp(lnTheta) * SizeTest.Foundation.Angles.AngleUnits.ArcsecPerRadian) - 2.5 * Math.Log10(2 * Math.PI);
        var obs = MockCatalogue.Draw(TestWorldModels.Eds.Create(Defaults), 3000, new MockCatalogue.Truth(Kormendy: 2.0), seed: 45,
            keep: (z, lnTheta, mu) => Mag(lnTheta, mu) < mLim);
        (double A, double Se) Fit(SelectionLimits cuts)
        {
            var lik = Hypothesis.Create(TestWorldModels.Eds, new NuisanceModel(ObservableKind.Joint, cuts, SizeSbRelation: true)).Bind(obs);
            var f = MaximumLikelihood.Fit(lik);
            Assert.True(f.Converged, f.ExitReason.Text);
            return (f.Theta[1], f.StandardError(1));
        }
        var (naive, _) = Fit(SelectionLimits.None);
        var (modelled, se) = Fit(new SelectionLimits(MagLimit: mLim));
        // Modelling the cut recovers a = −1 within 3σ of its Hessian error; ignoring it is further from the truth.
        Assert.True(Math.Abs(modelled + 1) < 3 * se, $"modelled {modelled} ± {se}, naive {naive}");
        Assert.True(Math.Abs(naive + 1) > Math.Abs(modelled + 1), $"naive {naive}, modelled {modelled}");
    }

    [Fact]
    public void OmegaMatterCanBeFreeWithinBounds()
    {
        var model = TestWorldModels.FlatLcdm.Create(new Dictionary<string, double> { ["omega_m"] = 0.3 });
        var obs = MockCatalogue.Draw(model, 4000, new MockCatalogue.Truth(SizeEvolution: 0, ScatterDex: 0.1), seed: 2, zMin: 0.05, zMax: 4);
        var h = Hypothesis.Create(TestWorldModels.FlatLcdm, new NuisanceModel(ObservableKind.Size),
            new ParameterOverrides(Free: new HashSet<string> { "omega_m" }, Fixed: new Dictionary<string, double> { ["size_evolution"] = 0 }));
        var lik = h.Bind(obs);
        var fit = MaximumLikelihood.Fit(lik);
        Assert.True(fit.Converged, fit.ExitReason.Text);
        var om = Est(FitSummaries.From(lik, fit), "omega_m");
        Assert.InRange(0.3, om.Value - 3 * (om.Hi - om.Lo) / 2, om.Value + 3 * (om.Hi - om.Lo) / 2);
    }

    [Fact]
    public void GaussianPriorPullsAnUnconstrainedParameter()
    {
        // h0 and r0 are degenerate for sizes; a Gaussian prior on h0 makes the fit well posed and h0 ≈ prior mean.
        var obs = MockCatalogue.Draw(TestWorldModels.Eds.Create(Defaults), 500, new MockCatalogue.Truth(), seed: 6);
        var h = Hypothesis.Create(TestWorldModels.Eds, new NuisanceModel(ObservableKind.Size),
            new ParameterOverrides(Priors: new Dictionary<string, (double, double)> { ["h0"] = (68, 2) }));
        var lik = h.Bind(obs);
        var fit = MaximumLikelihood.Fit(lik);
        Assert.True(fit.Converged, fit.ExitReason.Text);
        var h0 = Est(FitSummaries.From(lik, fit), "h0");
        Assert.InRange(h0.Value, 66, 70);          // the data are flat in h0 at fixed R0·H0: the prior decides (derived)
        Assert.InRange((h0.Hi - h0.Lo) / 2, 1.5, 2.5); // posterior σ ≈ prior σ = 2
    }

    [Fact]
    public void BootstrapIntervalsAgreeWithHessianAndAreDeterministic()
    {
        var obs = MockCatalogue.Draw(TestWorldModels.Eds.Create(Defaults), 800, new MockCatalogue.Truth(), seed: 12);
        var h = Hypothesis.Create(TestWorldModels.Eds, new NuisanceModel(ObservableKind.Size));
        var lik = h.Bind(obs);
        var fit = MaximumLikelihood.Fit(lik);
        var b1 = Bootstrap.Run(h, obs, fit.Theta, 100, seed: 5);
        var b2 = Bootstrap.Run(h, obs, fit.Theta, 100, seed: 5, maxDegreeOfParallelism: 1);
        Assert.Equal(b1, b2 with { }, new BootstrapComparer());
        int j = 1; // size_evolution
        double hess = fit.StandardError(j), boot = b1.Intervals[j].Sd;
        // For a well-specified Gaussian model the bootstrap and Hessian errors agree to ~ 1/√(2·100) ≈ 7% (plus noise); allow 30%.
        Assert.InRange(boot / hess, 0.7, 1.3);
        Assert.Equal(0, b1.Failed);
    }

    private sealed class BootstrapComparer : IEqualityComparer<BootstrapResult>
    {
        public bool Equals(BootstrapResult? x, BootstrapResult? y) =>
            x!.Failed == y!.Failed && x.Intervals.SequenceEqual(y.Intervals);
        public int GetHashCode(BootstrapResult obj) => 0;
    }

    [Fact]
    public void ProfileLikelihoodIntervalMatchesHessian()
    {
        var obs = MockCatalogue.Draw(TestWorldModels.Eds.Create(Defaults), 1000, new MockCatalogue.Truth(), seed: 14);
        var h = Hypothesis.Create(TestWorldModels.Eds, new NuisanceModel(ObservableKind.Size));
        var lik = h.Bind(obs);
        var fit = MaximumLikelihood.Fit(lik);
        var prof = ProfileLikelihood.Run(h, obs, fit, "size_evolution");
        double se = fit.StandardError(1);
        // For a near-Gaussian likelihood the Δ ln L = ½ interval equals ±1σ of the Hessian (Wilks 1938); 10% tolerance.
        Assert.Equal(fit.Theta[1] - se, prof.Lo, se * 0.1);
        Assert.Equal(fit.Theta[1] + se, prof.Hi, se * 0.1);
    }

    [Fact]
    public void CrossValidationPrefersTheTrueModel()
    {
        var obs = MockCatalogue.Draw(TestWorldModels.Eds.Create(Defaults), 10000, new MockCatalogue.Truth(ScatterDex: 0.08), seed: 40, zMin: 0.05, zMax: 5, lnThetaErr: 0.02);
        var nm = new NuisanceModel(ObservableKind.Size);
        var eds = CrossValidation.Run(Hypothesis.Create(TestWorldModels.Eds, nm), obs, 5, seed: 3);
        var stat = CrossValidation.Run(Hypothesis.Create(TestWorldModels.StaticLinear, nm), obs, 5, seed: 3);
        // Same folds for both (same seed), so the difference is paired; the true model predicts held-out objects better
        // (measured: 2650.1 against 2646.7 for this seed, the same order as the ln L̂ difference).
        Assert.True(eds.LogPredictiveDensity > stat.LogPredictiveDensity + 1, $"eds {eds.LogPredictiveDensity}, static {stat.LogPredictiveDensity}");
        Assert.Equal(0, eds.FailedFolds);
    }

    [Fact]
    [Trait("Category", "Slow")]
    public void SixtyEightPercentIntervalsCoverTheTruthAtTheNominalRate()
    {
        // 240 seeded mocks of 150 objects: the Hessian ±1σ interval of a should contain the truth 68% of the time;
        // the binomial 95% band for 240 trials is 68% ± 6% → accept 61–75% (the brief's band).
        int trials = 240, covered = 0;
        var nm = new NuisanceModel(ObservableKind.Size);
        var model = TestWorldModels.Eds.Create(Defaults);
        var h = Hypothesis.Create(TestWorldModels.Eds, nm);
        var hits = new int[trials];
        Parallel.For(0, trials, t =>
        {
            var obs = MockCatalogue.Draw(model, 150, new MockCatalogue.Truth(), seed: 1000 + t);
            var lik = h.Bind(obs);
            var fit = MaximumLikelihood.Fit(lik, new OptimizerSettings(Starts: 1));
            var a = FitSummaries.From(lik, fit).Parameters.Single(p => p.Name == "size_evolution");
            hits[t] = a.Lo <= -1.0 && -1.0 <= a.Hi ? 1 : 0;
        });
        covered = hits.Sum();
        output.WriteLine($"68% interval coverage of size_evolution over {trials} mocks: {covered / (double)trials:0.000}");
        Assert.InRange(covered / (double)trials, 0.61, 0.75);
    }
}

using SizeTest.Catalogues;
using SizeTest.Foundation.Errors;
using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Photometry;
using Xunit;

namespace SizeTest.Tests.Inference;

/// <summary>
/// Isophotal sizes in the angular-size likelihood: a synthetic (mock) isophotal sample drawn with a known world model
/// (EdS) and SB parameters, its isophotal radii computed with <see cref="IsophotalSize"/>, is fitted with the isophotal
/// path (recovering the injected size evolution) and as if the sizes were effective radii (biased by the dimming).
/// </summary>
public sealed class IsophotalLikelihoodTests
{
    private static readonly IReadOnlyDictionary<string, double> Defaults = new Dictionary<string, double>();

    // Truth of the synthetic sample: R_e = 4 kpc (1+z)^-1 with 0.15 dex scatter; μ_e,rest = 20.5 − 2.5·1·log10(1+z)
    // with 0.1 mag scatter (SB at R_e); Sérsic n = 1; isophote 26 mag/arcsec²; z uniform in [0.1, 1.5].
    private const double R0 = 4.0, A = -1.0, ScatterDex = 0.15, Mu0 = 20.5, B = 1.0, ScatterMag = 0.1, N = 1.0, Iso = 26.0;
    private const double ThetaErr = 0.05, MuErr = 0.05;

    internal sealed record Mock(Observables Isophotal, Observables AsEffective, double[] MeanLnRatio);

    internal static Mock Draw(int n, int seed)
    {
        var model = TestWorldModels.Eds.Create(Defaults);
        var rng = new Random(seed);
        var z = new double[n]; var y = new double[n]; var mu = new double[n]; var meanRatio = new double[n];
        var iso = new IsophotalSize(N);
        for (int i = 0; i < n; i++)
        {
            double zi = 0.1 + 1.4 * rng.NextDouble();
            double lnRe = Math.Log(R0) + A * Math.Log(1 + zi) + Math.Log(10) * ScatterDex * MockCatalogue.Gauss(rng);
            double muRest = Mu0 - 2.5 * B * Math.Log10(1 + zi);
            double muEffObs = SurfaceBrightness.Observed(muRest + ScatterMag * MockCatalogue.Gauss(rng), zi, model.BolometricDimmingExponent);
            Assert.True(iso.TryLnRadiusRatio(muEffObs, Iso, out double lnRatio)); // every object reaches the isophote
            Assert.True(iso.TryLnRadiusRatio(SurfaceBrightness.Observed(muRest, zi, model.BolometricDimmingExponent), Iso, out meanRatio[i]));
            z[i] = zi;
            y[i] = lnRe + lnRatio + Math.Log(1e-3) - Math.Log(model.AngularDiameterDistance(zi)) + ThetaErr * MockCatalogue.Gauss(rng);
            mu[i] = muEffObs + MuErr * MockCatalogue.Gauss(rng);
        }
        var e = Enumerable.Repeat(ThetaErr, n).ToArray();
        var me = Enumerable.Repeat(MuErr, n).ToArray();
        var isoObs = new Observables(z, y, e, mu, me, sizeDefinition: new SizeDefinition(SizeKind.Isophotal, Iso),
            isophote: Enumerable.Repeat(Iso, n).ToArray(), sersicIndex: N);
        return new Mock(isoObs, new Observables(z, y, e, mu, me), meanRatio);
    }

    private static ParameterEstimate Est(ModelFitSummary s, string name) => s.Parameters.Single(p => p.Name == name);

    [Fact]
    public void IsophotalJointFitRecoversInjectedSizeAndSbEvolution()
    {
        var mock = Draw(3000, seed: 11);
        var lik = Hypothesis.Create(TestWorldModels.Eds, new NuisanceModel(ObservableKind.Joint)).Bind(mock.Isophotal);
        var fit = MaximumLikelihood.Fit(lik);
        Assert.True(fit.Converged, fit.ExitReason.Text);
        var s = FitSummaries.From(lik, fit);
        foreach (var (name, t) in new[] { ("size_evolution", A), ("r0_kpc", R0), ("sb_evolution", B), ("mu0", Mu0), ("scatter_dex", ScatterDex) })
        {
            var e = Est(s, name);
            double sigma = (e.Hi - e.Lo) / 2;
            Assert.InRange(t, e.Value - 3 * sigma, e.Value + 3 * sigma); // 3σ of the Hessian error (common practice; fixed seed)
        }
    }

    [Fact]
    public void FittingIsophotalSizesAsEffectiveRadiiGivesTheDimmingBias()
    {
        var mock = Draw(3000, seed: 12);
        var lik = Hypothesis.Create(TestWorldModels.Eds, new NuisanceModel(ObservableKind.Size)).Bind(mock.AsEffective);
        var fit = MaximumLikelihood.Fit(lik);
        Assert.True(fit.Converged, fit.ExitReason.Text);
        var a = Est(FitSummaries.From(lik, fit), "size_evolution");
        double sigma = (a.Hi - a.Lo) / 2;
        // Expected bias (derived): with uniform errors and D_A fixed the size fit is least squares of ln θ on ln(1+z), so the
        // fitted slope is a + the least-squares slope of the mean ln(r_iso/R_e) on ln(1+z). For these truths (dimming
        // 2.5(4 − 1) = 7.5 mag per dex of 1+z against an isophote 3–5 mag below μ_e,obs) that slope is ≈ −0.6: the
        // effective-radius reading makes sizes look to shrink by (1+z)^−1.6 instead of (1+z)^−1.
        // Measured with seed 12: predicted slope −0.587, fitted a = −1.593 ± 0.027 as effective radii (bias −0.59, 22σ),
        // a = −1.008 ± 0.027 with the isophotal path.
        var x = mock.AsEffective.Z.Select(zz => Math.Log(1 + zz)).ToArray();
        double mx = x.Average(), my = mock.MeanLnRatio.Average();
        double slope = x.Zip(mock.MeanLnRatio, (xi, yi) => (xi - mx) * (yi - my)).Sum() / x.Sum(xi => (xi - mx) * (xi - mx));
        Assert.InRange(slope, -0.75, -0.45); // the closed-form bias for this sample (computed above; ≈ −0.6)
        Assert.InRange(a.Value, A + slope - 3 * sigma, A + slope + 3 * sigma); // biased as predicted, within 3σ
        Assert.True(Math.Abs(a.Value - A) > 8 * sigma, $"a = {a.Value} ± {sigma} should be far from the truth {A}");
        // The isophotal path on the same objects removes the bias.
        var likIso = Hypothesis.Create(TestWorldModels.Eds, new NuisanceModel(ObservableKind.Joint)).Bind(mock.Isophotal);
        var fitIso = MaximumLikelihood.Fit(likIso);
        var aIso = Est(FitSummaries.From(likIso, fitIso), "size_evolution");
        Assert.InRange(A, aIso.Value - 1.5 * (aIso.Hi - aIso.Lo), aIso.Value + 1.5 * (aIso.Hi - aIso.Lo)); // 3σ
    }

    [Fact]
    public void IsophotalPredictionMatchesTheSersicFormulaAndIsNegativeInfinityWhereTheIsophoteIsNotReached()
    {
        // One object; every parameter fixed except mu0, so ln L(mu0) can be checked by hand.
        var obs = new Observables([0.5], [Math.Log(1e-5)], [0.05], [22.0], [0.05],
            sizeDefinition: new SizeDefinition(SizeKind.Isophotal, Iso), isophote: [Iso], sersicIndex: N);
        var fixedValues = new Dictionary<string, double> { ["r0_kpc"] = 4, ["size_evolution"] = -1, ["scatter_dex"] = 0.1, ["sb_evolution"] = 1, ["scatter_mag"] = 0.1 };
        var lik = Hypothesis.Create(TestWorldModels.Eds, new NuisanceModel(ObservableKind.Joint), new ParameterOverrides(Fixed: fixedValues)).Bind(obs);
        Assert.Equal(1, lik.Dimension);
        var model = TestWorldModels.Eds.Create(Defaults);
        double mu0 = 20.0, log10OnePlusZ = Math.Log10(1.5);
        double muModel = mu0 + 2.5 * (4 - 1) * log10OnePlusZ;
        // ln θ_iso = ln(R0 (1+z)^a 1e-3 / D_A) + n ln[1 + (μ_iso − μ_e,obs) ln10 / (2.5 b_n)] (Graham & Driver 2005 eq. 5).
        double lnThetaIso = Math.Log(4 * Math.Pow(1.5, -1) * 1e-3 / model.AngularDiameterDistance(0.5))
                            + N * Math.Log(1 + (Iso - muModel) * Math.Log(10) / (2.5 * SersicProfile.Bn(N)));
        double vt = 0.05 * 0.05 + Math.Pow(Math.Log(10) * 0.1, 2), vm = 0.05 * 0.05 + 0.01;
        double rt = Math.Log(1e-5) - lnThetaIso, rm = 22.0 - muModel;
        double expected = -0.5 * (rt * rt / vt + rm * rm / vm + Math.Log(vt * vm)) - Math.Log(2 * Math.PI); // bivariate normal, ρ = 0
        Assert.Equal(expected, lik.LogDensity([mu0]), 10);
        // Observed central SB μ_e,obs − 2.5 b_n/ln10 ≥ μ_iso: the isophote is not reached → −∞ (documented treatment).
        double mu0Unreached = Iso + 2.5 * SersicProfile.Bn(N) / Math.Log(10) - 2.5 * 3 * log10OnePlusZ + 0.01;
        Assert.Equal(double.NegativeInfinity, lik.LogDensity([mu0Unreached]));
        Assert.True(double.IsFinite(lik.LogDensity([mu0Unreached - 0.02])));
    }

    [Fact]
    public void IsophotalSizesNeedTheJointObservableAndNoMagnitudeCut()
    {
        var mock = Draw(50, seed: 3);
        var size = Assert.Throws<InputException>(() => Hypothesis.Create(TestWorldModels.Eds, new NuisanceModel(ObservableKind.Size)).Bind(mock.Isophotal));
        Assert.Contains("--observable joint", size.Message);
        var mag = Assert.Throws<InputException>(() => Hypothesis.Create(TestWorldModels.Eds,
            new NuisanceModel(ObservableKind.Joint, new SelectionLimits(null, 24.0, null))).Bind(mock.Isophotal));
        Assert.Contains("--mag-limit", mag.Message);
        // The SB-only fit does not use the sizes, so isophotal sizes do not matter there.
        Assert.True(double.IsFinite(Hypothesis.Create(TestWorldModels.Eds, new NuisanceModel(ObservableKind.SurfaceBrightness)).Bind(mock.Isophotal)
            .LogDensity([Mu0, B, ScatterMag])));
    }
}

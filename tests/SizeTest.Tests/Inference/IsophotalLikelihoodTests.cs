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
    public void IsophotalPredictionUsesEachObjectsSersicIndex()
    {
        // Five objects with Sérsic indices 0.8–6 from a sersic_n column (the sample-wide index 1 must be overridden). Reference:
        // Reference/Photometry/sersic_isophote_scipy.py (scipy 1.10.1): b_n from gammaincinv(2n, 1/2), r_iso/R_e by brentq on the
        // profile's intensity, the light fraction inside the isophote from gammainc(2n, b_n x^(1/n)) (Graham & Driver 2005 eqs. 2–5).
        var rows = File.ReadAllLines(Path.Combine(AppContext.BaseDirectory, "Reference", "Photometry", "sersic_isophote_scipy.csv"))
            .Where(l => !l.StartsWith('#')).Skip(1).Select(l => l.Split(',').Select(v => double.Parse(v, System.Globalization.CultureInfo.InvariantCulture)).ToArray()).ToArray();
        Assert.Equal(5, rows.Length);
        var model = TestWorldModels.Eds.Create(Defaults);
        double mu0 = 20.0, r0 = 4, a = -1, sdex = 0.1, b = 1, smag = 0.1;
        int n = rows.Length;
        var z = rows.Select(r => r[0]).ToArray();
        var sersic = rows.Select(r => r[1]).ToArray();
        var lnTheta = new double[n];
        var mu = new double[n];
        double expected = 0;
        for (int i = 0; i < n; i++)
        {
            var (zi, ni, muEff, bn, lnRatio, light) = (rows[i][0], rows[i][1], rows[i][2], rows[i][3], rows[i][4], rows[i][5]);
            Assert.Equal(bn, SersicProfile.Bn(ni), 1e-12);                                          // b_n, absolute 1e-12
            Assert.Equal(lnRatio, IsophotalSize.TryLnRadiusRatio(ni, muEff, Iso, out double l) ? l : double.NaN, 1e-10); // absolute 1e-10 in ln
            Assert.Equal(light, SersicProfile.EnclosedLightFraction(ni, Math.Exp(lnRatio)), 1e-12);   // light inside the isophote, absolute 1e-12
            // The object sits 0.2 dex and 0.15 mag off the model, so ln L depends on the predicted isophotal radius.
            double lnThetaIso = Math.Log(r0 * Math.Pow(1 + zi, a) * 1e-3 / model.AngularDiameterDistance(zi)) + lnRatio;
            lnTheta[i] = lnThetaIso + 0.2 * Math.Log(10);
            mu[i] = muEff + 0.15;
            double vt = 0.05 * 0.05 + Math.Pow(Math.Log(10) * sdex, 2), vm = 0.05 * 0.05 + smag * smag;
            double rt = lnTheta[i] - lnThetaIso, rm = mu[i] - muEff;
            expected += -0.5 * (rt * rt / vt + rm * rm / vm + Math.Log(vt * vm)) - Math.Log(2 * Math.PI); // bivariate normal, ρ = 0
        }
        var obs = new Observables(z, lnTheta, Enumerable.Repeat(0.05, n).ToArray(), mu, Enumerable.Repeat(0.05, n).ToArray(),
            sizeDefinition: new SizeDefinition(SizeKind.Isophotal, Iso), isophote: Enumerable.Repeat(Iso, n).ToArray(), sersicIndex: 1.0,
            survey: new SurveyObservables(SersicN: sersic));
        var fixedValues = new Dictionary<string, double> { ["r0_kpc"] = r0, ["size_evolution"] = a, ["scatter_dex"] = sdex, ["sb_evolution"] = b, ["scatter_mag"] = smag };
        var lik = Hypothesis.Create(TestWorldModels.Eds, new NuisanceModel(ObservableKind.Joint), new ParameterOverrides(Fixed: fixedValues)).Bind(obs);
        Assert.Equal(expected, lik.LogDensity([mu0]), 9); // 9 decimals: the scipy radii carry ~1e-15 relative error
        // The sample-wide index alone (no column) predicts other radii and another ln L.
        var uniform = Hypothesis.Create(TestWorldModels.Eds, new NuisanceModel(ObservableKind.Joint), new ParameterOverrides(Fixed: fixedValues))
            .Bind(new Observables(z, lnTheta, obs.LnThetaErr!, mu, obs.MuErr!, sizeDefinition: obs.SizeDefinition, isophote: obs.Isophote, sersicIndex: 1.0));
        Assert.True(Math.Abs(uniform.LogDensity([mu0]) - expected) > 1, "a single n = 1 should not reproduce the per-object ln L");
    }

    [Fact]
    public void IsophotalSizesNeedTheJointObservableAndNoMagnitudeCut()
    {
        var mock = Draw(50, seed: 3);
        var size = Assert.Throws<InputException>(() => Hypothesis.Create(TestWorldModels.Eds, new NuisanceModel(ObservableKind.Size)).Bind(mock.Isophotal));
        // The library names the settings (observable, mag_limit); the CLI writes them as flags (PhotometryOptionsCliTests).
        Assert.Contains("observable joint", size.Message);
        Assert.DoesNotContain("--", size.Message);
        Assert.Contains("observable", Assert.Single(size.SettingProblems).Settings);
        var mag = Assert.Throws<InputException>(() => Hypothesis.Create(TestWorldModels.Eds,
            new NuisanceModel(ObservableKind.Joint, new SelectionLimits(null, 24.0, null))).Bind(mock.Isophotal));
        Assert.Contains("mag_limit", Assert.Single(mag.SettingProblems).Settings);
        Assert.DoesNotContain("--", mag.Message);
        // The SB-only fit does not use the sizes, so isophotal sizes do not matter there.
        Assert.True(double.IsFinite(Hypothesis.Create(TestWorldModels.Eds, new NuisanceModel(ObservableKind.SurfaceBrightness)).Bind(mock.Isophotal)
            .LogDensity([Mu0, B, ScatterMag])));
    }
}

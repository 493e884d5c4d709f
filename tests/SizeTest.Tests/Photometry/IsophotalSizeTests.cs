using SizeTest.Photometry;
using Xunit;

namespace SizeTest.Tests.Photometry;

public sealed class IsophotalSizeTests
{
    private const double MagPerEFold = 1.0857362047581294; // 2.5 log10(e), closed form

    [Theory]
    [InlineData(21.65, 25.0, 2.0)]   // Freeman (1970) central SB μ_0,B = 21.65 (docs/science.md Â§1.8), isophote 25
    [InlineData(20.0, 26.5, 1.3)]
    [InlineData(23.0, 24.0, 5.0)]
    public void ExponentialDiskClosedForm(double mu0, double isophote, double hArcsec)
    {
        // Exponential disk μ(r) = μ_0 + 1.0857 r/h ⇒ r_iso = h (μ_iso − μ_0)/1.0857 (closed form, Freeman 1970 profile).
        // As a Sérsic n = 1 profile: R_e = b_1 h, μ_e = μ_0 + 1.0857 b_1 (Graham & Driver 2005, eq. 7).
        double b1 = SersicProfile.Bn(1);
        double re = b1 * hArcsec, muE = mu0 + MagPerEFold * b1;
        Assert.True(IsophotalSize.TryLnRadiusRatio(1.0, muE, isophote, out double ln));
        double expected = hArcsec * (isophote - mu0) / MagPerEFold;
        Assert.Equal(expected, re * Math.Exp(ln), 10);
        var fixedN = new IsophotalSize(1.0);
        Assert.True(fixedN.TryLnRadiusRatio(muE, isophote, out double ln2));
        Assert.Equal(ln, ln2, 14);
    }

    [Theory]
    [InlineData(0.1)] [InlineData(0.5)] [InlineData(1.0)]
    public void ExponentialDiskShrinksWithTolmanDimming(double z)
    {
        // FLRW bolometric dimming Δμ = 10 log10(1+z) (Tolman 1930; docs/science.md §2.7) raises μ_0,obs, so
        // r_iso(z) = h (μ_iso − μ_0 − 10 log10(1+z))/1.0857 at fixed physical profile (closed form).
        double mu0 = 21.65, iso = 25.0, h = 2.0, b1 = SersicProfile.Bn(1);
        double dimming = 10 * Math.Log10(1 + z);
        double muEobs = mu0 + MagPerEFold * b1 + dimming;
        Assert.True(IsophotalSize.TryLnRadiusRatio(1.0, muEobs, iso, out double ln));
        Assert.Equal(h * (iso - mu0 - dimming) / MagPerEFold, b1 * h * Math.Exp(ln), 10);
        Assert.True(ln < Math.Log((iso - mu0) / (MagPerEFold * b1)));   // smaller than at z = 0
    }

    [Fact]
    public void NoIsophoteWhenCentreIsFainter()
    {
        // Undefined when μ_0,obs ≥ μ_iso: 10 log10(1+z) ≥ 25 − 21.65 = 3.35 ⇔ z ≥ 10^0.335 − 1 ≈ 1.1627 (closed form).
        double mu0 = 21.65, iso = 25.0, b1 = SersicProfile.Bn(1);
        double zEdge = Math.Pow(10, 0.335) - 1;
        double MuEobs(double z) => mu0 + MagPerEFold * b1 + 10 * Math.Log10(1 + z);
        Assert.True(IsophotalSize.TryLnRadiusRatio(1.0, MuEobs(zEdge - 1e-6), iso, out _));
        Assert.False(IsophotalSize.TryLnRadiusRatio(1.0, MuEobs(zEdge + 1e-6), iso, out double ln));
        Assert.Equal(double.NegativeInfinity, ln);
        Assert.Equal(0.0, IsophotalSize.RadiusRatio(1.0, MuEobs(2.0), iso));
        Assert.False(IsophotalSize.TryLnRadiusRatio(4.0, double.NaN, iso, out _));
    }

    [Theory]
    [InlineData(0.5)] [InlineData(2.0)] [InlineData(4.0)] [InlineData(8.0)]
    public void IsophoteAtMuEffectiveGivesRe(double n)
    {
        // μ(R_e) = μ_e by definition, so an isophote equal to μ_e,obs gives r_iso = R_e (ln ratio 0),
        // and the profile evaluated at the predicted radius returns the isophote (Graham & Driver 2005, eq. 5).
        Assert.True(IsophotalSize.TryLnRadiusRatio(n, 23.0, 23.0, out double ln0));
        Assert.Equal(0.0, ln0, 14);
        Assert.True(IsophotalSize.TryLnRadiusRatio(n, 22.0, 25.5, out double ln));
        Assert.Equal(25.5, SersicProfile.SurfaceBrightnessAt(n, 22.0, Math.Exp(ln)), 10);
    }

    [Fact]
    public void VectorisedMatchesScalarAndCountsReached()
    {
        var iso = new IsophotalSize(4.0);
        double[] mu = [20, 24, 26, 40];
        double[] level = [25, 25, 25, 25];
        var ln = new double[4];
        int reached = iso.LnRadiusRatios(mu, level, ln);
        Assert.Equal(3, reached);   // μ_0 = μ_e − 8.33 for n = 4: 40 − 8.33 > 25 is not reached
        for (int i = 0; i < 4; i++)
        {
            bool ok = IsophotalSize.TryLnRadiusRatio(4.0, mu[i], level[i], out double s);
            Assert.Equal(ok ? s : double.NegativeInfinity, ln[i]);
        }
    }
}

public sealed class IsophotalRecipeTests
{
    [Fact]
    public void DocumentedRecipeReproducesIsophotalSizesOfSyntheticDisks()
    {
        // Synthetic isophotal sample: exponential disks (n = 1), R_e = 5 kpc, μ_e,rest = 21.5 AB, in Einstein–de Sitter
        // (D_A = 2 D_H [1 − (1+z)^{−1/2}]/(1+z), closed form; D_H = 4282.7494 Mpc for H0 = 70), flat f_ν spectrum
        // (K = −2.5 log10(1+z), Hogg et al. 2002), A = 0.1, isophote 26 (observed, Vega-like, AB offset +0.2).
        double dh = 4282.7494, reKpc = 5, muRest = 21.5, isoNative = 26, zp = 0.2;
        double[] z = [0.05, 0.2, 0.5, 0.9];
        var theta = new double[z.Length];
        for (int i = 0; i < z.Length; i++)
        {
            double da = 2 * dh * (1 - 1 / Math.Sqrt(1 + z[i])) / (1 + z[i]);
            double thetaE = reKpc / (da * 1000);   // rad
            double muObs = SurfaceBrightness.Observed(muRest, z[i], 4, -2.5 * Math.Log10(1 + z[i]), 0.1);
            Assert.True(IsophotalSize.TryLnRadiusRatio(1, muObs, isoNative + zp, out double ln));
            theta[i] = thetaE * Math.Exp(ln);
        }
        var sample = new SizeTest.Catalogues.CatalogueRows("synthetic-isophotal", [1, 2, 3, 4], z, thetaRad: theta,
            sizeDefinition: new SizeTest.Catalogues.SizeDefinition(SizeTest.Catalogues.SizeKind.Isophotal, isoNative),
            extraColumns: new Dictionary<string, double[]> { ["A"] = [0.1, 0.1, 0.1, 0.1] });
        var zpTable = new BandTable(new Dictionary<string, double> { ["V"] = zp }, "synthetic", "AB zero-point offset");
        var o = ObservablesBuilder.Build(sample, new PhotometryOptions
        {
            KCorrection = new KCorrectionOption.PowerLaw(0), Extinction = new ExtinctionOption.Column("A"),
            ZeroPoints = zpTable, DefaultBand = "V", SersicIndex = 1,
        }).Observables;
        // DEVELOPERS.md recipe: muEffObs = μ_e,rest + 2.5·n_bol·log10(1+z) + K_i + A_i; ln θ_iso = ln(R/D_A) + lnRatio.
        var iso = new IsophotalSize(o.SersicIndex!.Value);
        for (int i = 0; i < z.Length; i++)
        {
            double da = 2 * dh * (1 - 1 / Math.Sqrt(1 + z[i])) / (1 + z[i]);
            double muEffObs = SurfaceBrightness.Observed(muRest, z[i], 4, o.KCorrection![i], o.Extinction![i]);
            Assert.True(iso.TryLnRadiusRatio(muEffObs, o.Isophote![i], out double lnRatio));
            Assert.Equal(o.LnTheta![i], Math.Log(reKpc / (da * 1000)) + lnRatio, 12);
        }
        // Under static-model dimming (n_bol = 1) the same disks would be seen larger: the bias the recipe removes.
        double muStatic = SurfaceBrightness.Observed(muRest, 0.9, 1, o.KCorrection![3], o.Extinction![3]);
        Assert.True(iso.TryLnRadiusRatio(muStatic, o.Isophote![3], out double lnStatic));
        double muFlrw = SurfaceBrightness.Observed(muRest, 0.9, 4, o.KCorrection[3], o.Extinction[3]);
        Assert.True(iso.TryLnRadiusRatio(muFlrw, o.Isophote[3], out double lnFlrw));
        Assert.True(lnStatic > lnFlrw);
    }
}

using SizeTest.Catalogues;
using SizeTest.Foundation.Errors;
using SizeTest.Photometry;
using Xunit;

namespace SizeTest.Tests.Photometry;

public sealed class BandMatchingTests
{
    // Synthetic 4-band survey; wavelengths are round numbers near SDSS g, r, i, z (illustrative only).
    private static readonly ObservedBand[] Bands =
    [
        new("r", "mu_r", "e_r", 6200),
        new("g", "mu_g", "e_g", 4800),   // deliberately out of order: the matcher sorts by wavelength
        new("i", "mu_i", "e_i", 7600),
        new("z", "mu_z", "e_z", 9100),
    ];

    private static CatalogueRows MakeSample(double[] z)
    {
        int n = z.Length;
        double[] Col(double v) => Enumerable.Range(0, n).Select(i => v + 0.01 * i).ToArray();
        var extra = new Dictionary<string, double[]>
        {
            ["mu_g"] = Col(22), ["mu_r"] = Col(21), ["mu_i"] = Col(20.5), ["mu_z"] = Col(20),
            ["e_g"] = Col(0.3), ["e_r"] = Col(0.2), ["e_i"] = Col(0.1), ["e_z"] = Col(0.4),
            ["ebv"] = Col(0.05),
        };
        return new CatalogueRows("synthetic-bands.csv", Enumerable.Range(2, n).Select(i => (long)i).ToArray(), z, extraColumns: extra);
    }

    [Fact]
    public void NearestBandInLogWavelength()
    {
        // λ_needed = 4400 (1+z): z = 0.1 → 4840 (g), 0.4 → 6160 (r), 0.75 → 7700 (i), 1.2 → 9680 (z, beyond the reddest band).
        var s = MakeSample([0.1, 0.4, 0.75, 1.2]);
        var zp = new BandTable(new Dictionary<string, double> { ["g"] = 0.1, ["r"] = 0.2, ["i"] = 0.3, ["z"] = 0.4 }, "zp (synthetic)", "AB zero-point offset");
        var coeff = new BandTable(new Dictionary<string, double> { ["g"] = 3.3, ["r"] = 2.3, ["i"] = 1.7, ["z"] = 1.3 }, "R (synthetic)", "A_band/E(B-V) coefficient");
        var r = ObservablesBuilder.Build(s, new PhotometryOptions
        {
            BandMatch = new BandMatchOption(Bands, 4400),
            ZeroPoints = zp,
            Extinction = new ExtinctionOption.ColourExcess("ebv", coeff),
        });
        var o = r.Observables;
        Assert.Equal([22 + 0.1, 21.01 + 0.2, 20.52 + 0.3, 20.03 + 0.4], o.Mu!, new ObservablesBuilderTests.Tol(1e-12));
        Assert.Equal([0.3, 0.21, 0.12, 0.43], o.MuErr!, new ObservablesBuilderTests.Tol(1e-12));
        Assert.Equal([3.3 * 0.05, 2.3 * 0.06, 1.7 * 0.07, 1.3 * 0.08], o.Extinction!, new ObservablesBuilderTests.Tol(1e-12));
        Assert.Contains(r.Corrections, c => c.Contains("1 objects need a wavelength outside"));
    }

    [Fact]
    public void InterpolationIsLinearInLogWavelength()
    {
        // λ_needed = √(4800·6200) (geometric mean) gives weight 1/2 to g and r; errors add in quadrature with the weights.
        double zMid = Math.Sqrt(4800.0 * 6200) / 4400 - 1;
        // a quarter of the way in ln λ from g to r
        double zQ = Math.Exp(Math.Log(4800) + 0.25 * Math.Log(6200.0 / 4800)) / 4400 - 1;
        var s = MakeSample([zMid, zQ]);
        var o = ObservablesBuilder.Build(s, new PhotometryOptions { BandMatch = new BandMatchOption(Bands, 4400, null, BandMatchMode.Interpolate) }).Observables;
        Assert.Equal(0.5 * 22 + 0.5 * 21, o.Mu![0], 12);
        Assert.Equal(0.75 * 22.01 + 0.25 * 21.01, o.Mu[1], 12);
        Assert.Equal(Math.Sqrt(0.25 * 0.09 + 0.25 * 0.04), o.MuErr![0], 12);
    }

    [Theory]
    [InlineData(-1.0)] [InlineData(0.0)] [InlineData(1.3)]
    public void ResidualKForPowerLawNarrowBands(double alpha)
    {
        // Residual K between the matched band and the target for f_ν ∝ ν^α, narrow bands (Hogg et al. 2002 eq. 8):
        // K = −2.5 log10(1+z) − 2.5 α log10[(1+z) λ_Q/λ_R]. When λ_R = λ_Q(1+z) exactly only the bandwidth term remains.
        double zExact = 6200.0 / 4400 - 1;   // target lands exactly on r
        var s = MakeSample([zExact, 0.1, 0.75]);
        var o = ObservablesBuilder.Build(s, new PhotometryOptions
        {
            BandMatch = new BandMatchOption(Bands, 4400),
            KCorrection = new KCorrectionOption.PowerLaw(alpha),
        }).Observables;
        Assert.Equal(-2.5 * Math.Log10(1 + zExact), o.KCorrection![0], 9);
        Assert.Equal(PowerLawKCorrection.BetweenBands(alpha, 0.1, 4800, 4400), o.KCorrection[1], 9);
        Assert.Equal(PowerLawKCorrection.BetweenBands(alpha, 0.75, 7600, 4400), o.KCorrection[2], 9);
    }

    [Fact]
    public void ResidualKInterpolatedIsWeighted()
    {
        double zQ = Math.Exp(Math.Log(4800) + 0.25 * Math.Log(6200.0 / 4800)) / 4400 - 1;
        var s = MakeSample([zQ]);
        var o = ObservablesBuilder.Build(s, new PhotometryOptions
        {
            BandMatch = new BandMatchOption(Bands, 4400, null, BandMatchMode.Interpolate),
            KCorrection = new KCorrectionOption.PowerLaw(-0.7),
        }).Observables;
        // m_interp = w m_g + (1−w) m_r ⇒ K_interp = w K_g + (1−w) K_r (linearity of the interpolation), w = 3/4.
        double expected = 0.75 * PowerLawKCorrection.BetweenBands(-0.7, zQ, 4800, 4400) + 0.25 * PowerLawKCorrection.BetweenBands(-0.7, zQ, 6200, 4400);
        Assert.Equal(expected, o.KCorrection![0], 9);
    }

    [Fact]
    public void ResidualKThroughCurvesMatchesTemplateKCorrection()
    {
        var target = KCorrectionTests.GaussianFilter(4400, 300, "B");
        var g = KCorrectionTests.GaussianFilter(4800, 350, "g");
        var rr = KCorrectionTests.GaussianFilter(6200, 400, "r");
        ObservedBand[] bands = [new("g", "mu_g", null, g.PivotWavelengthAngstrom, g), new("r", "mu_r", null, rr.PivotWavelengthAngstrom, rr)];
        var t = KCorrectionTests.BumpyTemplate();
        var s = MakeSample([0.05, 0.45]);
        var o = ObservablesBuilder.Build(s, new PhotometryOptions
        {
            BandMatch = new BandMatchOption(bands, target.PivotWavelengthAngstrom, target),
            KCorrection = new KCorrectionOption.Template(t, null),
        }).Observables;
        // Same definition (Hogg et al. 2002 eq. 8) evaluated directly; builder uses a 1e-3 z grid with cubic interpolation (≤ 2e-6 mag).
        Assert.Equal(new TemplateKCorrection(t, g, target).Evaluate(0.05), o.KCorrection![0], 2e-6);
        Assert.Equal(new TemplateKCorrection(t, rr, target).Evaluate(0.45), o.KCorrection[1], 2e-6);
        Assert.Null(o.MuErr);
    }

    [Fact]
    public void MissingValuesOnlyMatterWhereTheBandIsUsed()
    {
        // g is used only by the z = 0.1 object; a missing g value for the z = 0.75 object (uses i) is fine.
        var s = MakeSample([0.1, 0.75]);
        s.ExtraColumns["mu_g"][1] = double.NaN;
        var o = ObservablesBuilder.Build(s, new PhotometryOptions { BandMatch = new BandMatchOption(Bands, 4400) }).Observables;
        Assert.Equal(20.51, o.Mu![1], 12);
        s.ExtraColumns["mu_g"][0] = double.NaN;
        var e = Assert.Throws<InputException>(() => ObservablesBuilder.Build(s, new PhotometryOptions { BandMatch = new BandMatchOption(Bands, 4400) }));
        Assert.Equal(2, e.Line);
        Assert.Equal("mu_g", e.Column);
    }

    [Fact]
    public void BandMatchErrors()
    {
        var s = MakeSample([0.1]);
        ObservedBand[] missing = [new("u", "mu_u", null, 3500)];
        Assert.Contains("'mu_u'", Assert.Throws<InputException>(() => ObservablesBuilder.Build(s, new PhotometryOptions { BandMatch = new BandMatchOption(missing, 4400) })).Message);
        ObservedBand[] mixed = [new("g", "mu_g", "e_g", 4800), new("r", "mu_r", null, 6200)];
        Assert.Contains("every band or for none", Assert.Throws<InputException>(() => ObservablesBuilder.Build(s, new PhotometryOptions { BandMatch = new BandMatchOption(mixed, 4400) })).Message);
        ObservedBand[] twice = [new("g", "mu_g", null, 4800), new("g", "mu_r", null, 6200)];
        Assert.Contains("twice", Assert.Throws<InputException>(() => ObservablesBuilder.Build(s, new PhotometryOptions { BandMatch = new BandMatchOption(twice, 4400) })).Message);
    }
}

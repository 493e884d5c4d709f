using SizeTest.Catalogues;
using SizeTest.Foundation.Errors;
using SizeTest.Photometry;
using Xunit;
using SizeTest.Foundation.Angles;

namespace SizeTest.Tests.Photometry;

public sealed class ObservablesBuilderTests
{
    private static CatalogueRows MakeSample(
        double[]? mu = null, string[]? band = null, Dictionary<string, double[]>? extra = null,
        double[]? mag = null, double[]? thetaArcsec = null, SizeDefinition? size = null)
    {
        double[] z = [0.1, 0.5, 1.0];
        var theta = (thetaArcsec ?? [2.0, 1.0, 0.8]).Select(t => t * AngleUnits.RadiansPerArcsec).ToArray();
        return new CatalogueRows("synthetic.csv", [2, 3, 4], z, thetaRad: theta, thetaErrRad: theta.Select(t => 0.1 * t).ToArray(),
            mu: mu ?? [21.0, 22.0, 23.0], muErr: [0.1, 0.1, 0.2], mag: mag, magErr: mag is null ? null : [0.05, 0.05, 0.05],
            band: band, sizeDefinition: size, extraColumns: extra);
    }

    [Fact]
    public void DefaultOptionsEqualTrivialConversion()
    {
        var s = MakeSample();
        var r = ObservablesBuilder.Build(s, PhotometryOptions.Default);
        var t = Observables.FromRows(s);
        Assert.Equal(t.LnTheta, r.Observables.LnTheta);
        Assert.Equal(t.Mu, r.Observables.Mu);
        Assert.Null(r.Observables.KCorrection);
        Assert.Null(r.Observables.Extinction);
        Assert.NotEmpty(r.Corrections);
    }

    [Fact]
    public void ZeroPointsAndExtinctionArithmetic()
    {
        // m_AB = m + offset per band; A = R_band × E(B−V) (arithmetic of the definitions).
        var zp = new BandTable(new Dictionary<string, double> { ["J"] = 0.91, ["g"] = -0.08 }, "zp.txt (synthetic)", "AB zero-point offset");
        var coeff = new BandTable(new Dictionary<string, double> { ["J"] = 0.72, ["g"] = 3.30 }, "coeffs.txt (synthetic)", "A_band/E(B-V) coefficient");
        var s = MakeSample(band: ["J", "g", "J"], extra: new() { ["ebv"] = [0.02, 0.10, 0.05] });
        var r = ObservablesBuilder.Build(s, new PhotometryOptions
        {
            ZeroPoints = zp,
            Extinction = new ExtinctionOption.ColourExcess("ebv", coeff),
        });
        Assert.Equal([21.91, 21.92, 23.91], r.Observables.Mu!, new Tol(1e-12));
        Assert.Equal([0.72 * 0.02, 3.30 * 0.10, 0.72 * 0.05], r.Observables.Extinction!, new Tol(1e-12));
        Assert.Contains(r.Corrections, c => c.Contains("coeffs.txt (synthetic)"));
        Assert.Contains(r.Corrections, c => c.Contains("zp.txt (synthetic)"));
    }

    [Fact]
    public void ExtinctionAndKFromColumns()
    {
        var s = MakeSample(extra: new() { ["A_r"] = [0.1, 0.2, 0.3], ["kcorr"] = [0.01, 0.3, 0.9] });
        var r = ObservablesBuilder.Build(s, new PhotometryOptions
        {
            Extinction = new ExtinctionOption.Column("A_r"),
            KCorrection = new KCorrectionOption.Column("kcorr"),
        });
        Assert.Equal([0.1, 0.2, 0.3], r.Observables.Extinction!);
        Assert.Equal([0.01, 0.3, 0.9], r.Observables.KCorrection!);
    }

    [Fact]
    public void PowerLawKPerObject()
    {
        // K = −2.5 (1+α) log10(1+z) per object (Hogg et al. 2002 closed form).
        var r = ObservablesBuilder.Build(MakeSample(), new PhotometryOptions { KCorrection = new KCorrectionOption.PowerLaw(-0.5) });
        Assert.Equal([-1.25 * Math.Log10(1.1), -1.25 * Math.Log10(1.5), -1.25 * Math.Log10(2)], r.Observables.KCorrection!, new Tol(1e-13));
    }

    [Fact]
    public void TemplateKPerObjectMatchesDirectEvaluation()
    {
        var t = KCorrectionTests.BumpyTemplate();
        var obs = KCorrectionTests.GaussianFilter(6200, 400, "r");
        var rest = KCorrectionTests.GaussianFilter(4400, 300, "B");
        var r = ObservablesBuilder.Build(MakeSample(), new PhotometryOptions { KCorrection = new KCorrectionOption.Template(t, obs, rest) });
        var kc = new TemplateKCorrection(t, obs, rest);
        // Grid step 1e-3 with cubic interpolation (KCorrectionGrid): agreement to 2e-6 mag.
        Assert.Equal([kc.Evaluate(0.1), kc.Evaluate(0.5), kc.Evaluate(1.0)], r.Observables.KCorrection!, new Tol(2e-6));
    }

    [Fact]
    public void SurfaceBrightnessFromMagnitudeAndConversion()
    {
        // ⟨μ⟩_e = m + 2.5 log10(2π R_e²) (closed form), then to μ_e with −(⟨μ⟩_e − μ_e)(n = 4) (Graham & Driver 2005).
        var s = MakeSample(mag: [18, 19, 20], thetaArcsec: [2, 1, 0.5]);
        var r = ObservablesBuilder.Build(s, new PhotometryOptions
        {
            SurfaceBrightness = new SurfaceBrightnessOption(true, null, SurfaceBrightnessKind.AtEffective),
            SersicIndex = 4,
        });
        double off = -SersicProfile.MeanMinusEffective(4);
        double[] expected = [18 + 2.5 * Math.Log10(2 * Math.PI * 4) + off, 19 + 2.5 * Math.Log10(2 * Math.PI) + off, 20 + 2.5 * Math.Log10(2 * Math.PI * 0.25) + off];
        Assert.Equal(expected, r.Observables.Mu!, new Tol(1e-12));
        // σ_⟨μ⟩² = σ_m² + (5/ln10 · σ_R/R)² with σ_m = 0.05, σ_R/R = 0.1 (error propagation).
        Assert.Equal(Math.Sqrt(0.05 * 0.05 + Math.Pow(0.5 / Math.Log(10), 2)), r.Observables.MuErr![0], 12);
    }

    [Fact]
    public void SurfaceBrightnessFromMagnitudeWithoutMagErrorsKeepsTheSizeTerm()
    {
        // No mag_err column: σ_⟨μ⟩ = 5/ln10 · σ_R/R = 5/ln10 × 0.1 = 0.2171 (propagation of m + 5 log10 R_e with σ_m = 0), not "no error".
        var s = MakeSample(mag: [18, 19, 20], thetaArcsec: [2, 1, 0.5]);
        s = new CatalogueRows(s.SourceName, [2, 3, 4], s.Z, thetaRad: s.ThetaRad, thetaErrRad: s.ThetaErrRad, mu: s.Mu, muErr: s.MuErr, mag: s.Mag, magErr: null);
        var r = ObservablesBuilder.Build(s, new PhotometryOptions { SurfaceBrightness = new SurfaceBrightnessOption(true) });
        Assert.Equal([0.5 / Math.Log(10), 0.5 / Math.Log(10), 0.5 / Math.Log(10)], r.Observables.MuErr!, new Tol(1e-12));
        Assert.Contains(r.Corrections, c => c.Contains("no mag_err column is mapped, so its error is the size term", StringComparison.Ordinal));
        // Neither error: no SB measurement error, and the note says so.
        var bare = new CatalogueRows(s.SourceName, [2, 3, 4], s.Z, thetaRad: s.ThetaRad, mu: s.Mu, mag: s.Mag);
        var r2 = ObservablesBuilder.Build(bare, new PhotometryOptions { SurfaceBrightness = new SurfaceBrightnessOption(true) });
        Assert.Null(r2.Observables.MuErr);
        Assert.Contains(r2.Corrections, c => c.Contains("neither mag_err nor theta_err is mapped", StringComparison.Ordinal));
    }

    [Fact]
    public void IsophotalSampleCarriesIsophoteAndSersicIndex()
    {
        var zp = new BandTable(new Dictionary<string, double> { ["B"] = -0.1 }, "zp", "AB zero-point offset");
        var s = MakeSample(size: new SizeDefinition(SizeKind.Isophotal, 25.0));
        Assert.Throws<InputException>(() => ObservablesBuilder.Build(s, PhotometryOptions.Default));   // needs n
        var r = ObservablesBuilder.Build(s, new PhotometryOptions { SersicIndex = 1, ZeroPoints = zp, DefaultBand = "B" });
        Assert.Equal([24.9, 24.9, 24.9], r.Observables.Isophote!, new Tol(1e-12));
        Assert.Equal(1.0, r.Observables.SersicIndex);
        Assert.Equal(SizeKind.Isophotal, r.Observables.SizeDefinition.Kind);
    }

    [Fact]
    public void ConfigurationErrorsAreInputExceptionsNamingTheProblem()
    {
        var s = MakeSample();
        var e1 = Assert.Throws<InputException>(() => ObservablesBuilder.Build(s, new PhotometryOptions { KCorrection = new KCorrectionOption.Column("nope") }));
        Assert.Contains("'nope'", e1.Message);
        var zp = new BandTable(new Dictionary<string, double> { ["J"] = 0.91 }, "zp.txt", "AB zero-point offset");
        var e2 = Assert.Throws<InputException>(() => ObservablesBuilder.Build(s, new PhotometryOptions { ZeroPoints = zp }));
        Assert.Contains("band", e2.Message);
        var e3 = Assert.Throws<InputException>(() => ObservablesBuilder.Build(MakeSample(band: ["J", "K", "J"]), new PhotometryOptions { ZeroPoints = zp }));
        Assert.Contains("'K'", e3.Message);
        Assert.Equal(3, e3.Line);   // source row of the second object
        var bad = MakeSample(extra: new() { ["A"] = [0.1, double.NaN, 0.2] });
        var e4 = Assert.Throws<InputException>(() => ObservablesBuilder.Build(bad, new PhotometryOptions { Extinction = new ExtinctionOption.Column("A") }));
        Assert.Equal(3, e4.Line);
        Assert.Throws<InputException>(() => ObservablesBuilder.Build(s, new PhotometryOptions
        {
            SurfaceBrightness = new SurfaceBrightnessOption(false, SurfaceBrightnessKind.MeanWithinEffective, SurfaceBrightnessKind.Central),
        }));   // conversion without n
        var farTemplate = KCorrectionTests.PowerLawTable(0, SpectralDensity.PerFrequency);   // starts at 300 Å
        var uv = KCorrectionTests.GaussianFilter(600, 25, "uv");   // 500–700 Å
        var e5 = Assert.Throws<InputException>(() => ObservablesBuilder.Build(s, new PhotometryOptions { KCorrection = new KCorrectionOption.Template(farTemplate, uv, uv) }));
        Assert.Equal(4, e5.Line);   // usable for z ≤ 500/300 − 1 = 0.667: the z = 1 object (source row 4) fails
    }

    internal sealed class Tol(double tol) : IEqualityComparer<double>
    {
        public bool Equals(double x, double y) => Math.Abs(x - y) <= tol;
        public int GetHashCode(double obj) => 0;
    }
}

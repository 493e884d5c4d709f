using SizeTest.Photometry;
using Xunit;

namespace SizeTest.Tests.Photometry;

public sealed class KCorrectionTests
{
    /// <summary>A smooth, Gaussian-shaped photon-counting response tabulated on 81 nodes (synthetic).</summary>
    internal static FilterResponse GaussianFilter(double centre, double sigma, string name)
    {
        var l = new double[81];
        var r = new double[81];
        for (int i = 0; i < 81; i++)
        {
            l[i] = centre + (i - 40) * sigma / 10.0;
            double x = (l[i] - centre) / sigma;
            r[i] = i == 0 || i == 80 ? 0 : Math.Exp(-0.5 * x * x);
        }
        return FilterResponse.FromColumns(l, r, name);
    }

    /// <summary>f_ν ∝ ν^α tabulated on 400 log-spaced nodes from 300 Å to 60000 Å, as f_ν or as f_λ ∝ λ^{−α−2}.</summary>
    internal static SpectralTable PowerLawTable(double alpha, SpectralDensity density)
    {
        int n = 400;
        var l = new double[n];
        var f = new double[n];
        for (int i = 0; i < n; i++)
        {
            l[i] = 300 * Math.Pow(200.0, i / (n - 1.0));
            f[i] = density == SpectralDensity.PerFrequency ? Math.Pow(l[i], -alpha) : 7.0 * Math.Pow(l[i], -alpha - 2);
        }
        return SpectralTable.FromColumns(l, f, density, $"power law {alpha}");
    }

    /// <summary>A bumpy synthetic spectrum with a 4000 Å break, f_λ, 1500 nodes from 300 to 60000 Å.</summary>
    internal static SpectralTable BumpyTemplate()
    {
        int n = 1500;
        var l = new double[n];
        var f = new double[n];
        for (int i = 0; i < n; i++)
        {
            l[i] = 300 * Math.Pow(200.0, i / (n - 1.0));
            f[i] = Math.Pow(l[i], -1.2) * (1 + 0.4 * Math.Sin(l[i] / 350.0)) * (l[i] < 4000 ? 0.4 : 1.0);
        }
        return SpectralTable.FromColumns(l, f, SpectralDensity.PerWavelength, "synthetic bumpy template");
    }

    private static readonly FilterResponse R = GaussianFilter(6200, 400, "R-like");
    private static readonly FilterResponse B = GaussianFilter(4400, 300, "B-like");
    private static readonly FilterResponse I = GaussianFilter(8000, 500, "I-like");

    [Theory]
    [InlineData(0.1)] [InlineData(0.5)] [InlineData(1.0)] [InlineData(2.0)]
    public void FlatFnuThroughAnyFiltersIsBandwidthTermOnly(double z)
    {
        // Flat f_ν with AB references: every band integral of L and g has the same shape, so
        // Hogg et al. 2002 eq. 8 reduces to K = −2.5 log10(1+z) for any R and Q (per-frequency convention).
        var flat = SpectralTable.FromColumns([100, 1e6], [1, 1], SpectralDensity.PerFrequency, "flat f_nu");
        foreach (var (obs, rest) in new[] { (R, R), (R, B), (I, B), (B, I) })
        {
            double k = new TemplateKCorrection(flat, obs, rest).Evaluate(z);
            Assert.Equal(-2.5 * Math.Log10(1 + z), k, 9);
        }
    }

    [Theory]
    [InlineData(-2.0, SpectralDensity.PerFrequency)]
    [InlineData(-1.0, SpectralDensity.PerWavelength)]
    [InlineData(0.0, SpectralDensity.PerWavelength)]
    [InlineData(0.7, SpectralDensity.PerFrequency)]
    [InlineData(1.5, SpectralDensity.PerWavelength)]
    public void PowerLawTemplateMatchesClosedFormTo1e6Mag(double alpha, SpectralDensity density)
    {
        // Hogg et al. 2002 closed form for f_ν ∝ ν^α in the same band: K = −2.5 (1+α) log10(1+z).
        var t = PowerLawTable(alpha, density);
        foreach (var band in new[] { B, R, I })
        {
            var kc = new TemplateKCorrection(t, band, band);
            foreach (double z in new[] { 0.0, 0.05, 0.3, 0.8, 1.5, 3.0 })
            {
                double k = kc.Evaluate(z);
                Assert.True(Math.Abs(k - PowerLawKCorrection.SameBand(alpha, z)) < 1e-6, $"band {band.Name}, z = {z}: {k} vs {PowerLawKCorrection.SameBand(alpha, z)}");
            }
        }
    }

    [Theory]
    [InlineData(0.3)] [InlineData(1.0)] [InlineData(2.5)]
    public void BandwidthFactorCountedOnce(double z)
    {
        // Observe through R(λ) = Q(λ/(1+z)): the rest band redshifted onto the sky. Hogg et al. 2002 (§3) note that
        // such a band makes K independent of the source spectrum — it does not make K vanish.
        // Then ∫ L_ν(λ/(1+z)) R dλ/λ = ∫ L_ν Q dλ'/λ' and, with AB references, ∫g R = ∫g Q, so for ANY spectrum
        // eq. 8 of Hogg et al. 2002 leaves only the bandwidth factor: K = −2.5 log10(1+z).
        // Counting (1+z) twice would give −5 log10(1+z); forgetting it would give 0.
        var t = BumpyTemplate();
        var shifted = B.Shifted(1 + z, "B shifted");
        double k = new TemplateKCorrection(t, shifted, B).Evaluate(z);
        Assert.Equal(-2.5 * Math.Log10(1 + z), k, 6);
        Assert.True(Math.Abs(k - -5 * Math.Log10(1 + z)) > 0.1 && Math.Abs(k) > 0.1);
    }

    [Fact]
    public void VegaLikeReferenceHasZeroColourInItsOwnSystem()
    {
        // Definition of a Vega-type system: the reference star has the same magnitude in every band,
        // so at z = 0 with the template equal to the reference, K_QR = m_R − m_Q = 0 for any R, Q
        // (Hogg et al. 2002 eq. 8 with g^R = g^Q = L). A blackbody-like synthetic reference (T = 9600 K).
        int n = 600;
        var l = new double[n];
        var f = new double[n];
        for (int i = 0; i < n; i++)
        {
            l[i] = 1000 * Math.Pow(30.0, i / (n - 1.0));
            double x = 1.4388e8 / (l[i] * 9600);   // hc/λkT with λ in Å (hc/k = 1.4388e8 Å K, CODATA 2018)
            f[i] = 1e-9 * Math.Pow(l[i], -5) / (Math.Exp(x) - 1) * 1e20;
        }
        var vega = SpectralTable.FromColumns(l, f, SpectralDensity.PerWavelength, "synthetic vega-like");
        Assert.Equal(0.0, new TemplateKCorrection(vega, R, B, vega, vega).Evaluate(0), 9);
        Assert.Equal(0.0, new TemplateKCorrection(vega, I, B, vega, vega).Evaluate(0), 9);
        // Same band: references cancel, so Vega and AB give the same K (eq. 8 with R = Q).
        var t = BumpyTemplate();
        Assert.Equal(new TemplateKCorrection(t, R, R).Evaluate(0.4), new TemplateKCorrection(t, R, R, vega, vega).Evaluate(0.4), 9);
        // Different bands: the difference is the reference's own R−Q colour in AB, independent of z and template:
        // K_Vega − K_AB = 2.5 log10(∫g_V R/∫g_AB R) − 2.5 log10(∫g_V Q/∫g_AB Q) = −(m_R,AB − m_Q,AB) of the reference,
        // which is −K_AB of the reference itself at z = 0.
        double diff1 = new TemplateKCorrection(t, R, B, vega, vega).Evaluate(0.4) - new TemplateKCorrection(t, R, B).Evaluate(0.4);
        double diff2 = new TemplateKCorrection(t, R, B, vega, vega).Evaluate(0.1) - new TemplateKCorrection(t, R, B).Evaluate(0.1);
        Assert.Equal(diff1, diff2, 9);
        Assert.Equal(-new TemplateKCorrection(vega, R, B).Evaluate(0), diff1, 9);
    }

    [Theory]
    [InlineData(-1.0, 0.5)] [InlineData(0.5, 1.2)] [InlineData(-2.0, 2.0)]
    public void NarrowBandsMatchClosedFormBetweenBands(double alpha, double z)
    {
        // Hogg et al. 2002 eq. 8 with narrow (0.5 % wide) top-hats: K = −2.5 log10(1+z) − 2.5 α log10[(1+z) λ_Q/λ_R].
        // The finite width changes K by O(α (Δλ/λ)²) ~ 1e-5 mag.
        var narrowR = FilterResponse.TopHat(7000 * 0.9975, 7000 * 1.0025, "narrow 7000");
        var narrowQ = FilterResponse.TopHat(4000 * 0.9975, 4000 * 1.0025, "narrow 4000");
        double k = new TemplateKCorrection(PowerLawTable(alpha, SpectralDensity.PerFrequency), narrowR, narrowQ).Evaluate(z);
        Assert.Equal(PowerLawKCorrection.BetweenBands(alpha, z, narrowR.PivotWavelengthAngstrom, narrowQ.PivotWavelengthAngstrom), k, 4);
    }

    [Fact]
    public void ClosedFormsReduceCorrectly()
    {
        // Same band: −2.5(1+α) log10(1+z); flat f_λ (α = −2) gives +2.5 log10(1+z) (closed form).
        Assert.Equal(2.5 * Math.Log10(2), PowerLawKCorrection.SameBand(-2, 1), 14);
        Assert.Equal(PowerLawKCorrection.SameBand(0.3, 1.7), PowerLawKCorrection.BetweenBands(0.3, 1.7, 5000, 5000), 13);
        Assert.Equal(-2.5 * Math.Log10(3), PowerLawKCorrection.BetweenBands(1.1, 2, 3 * 4400, 4400), 13);
    }

    [Fact]
    public void CoverageIsChecked()
    {
        var t = PowerLawTable(0, SpectralDensity.PerFrequency);   // 300–60000 Å
        var kc = new TemplateKCorrection(t, R, R);
        // Template starts at 300 Å; R starts at 6200 − 4·400 = 4600 Å, so z_max = 4600/300 − 1 (closed form).
        Assert.Equal(4600 / 300.0 - 1, kc.MaxRedshift, 9);
        Assert.False(kc.TryEvaluate(kc.MaxRedshift + 0.1, out double k));
        Assert.True(double.IsNaN(k));
        Assert.Throws<ArgumentOutOfRangeException>(() => kc.Evaluate(20));
        var far = GaussianFilter(100000, 1000, "far");
        Assert.Throws<ArgumentException>(() => new TemplateKCorrection(t, R, far));
    }

    [Fact]
    public void GridInterpolationIsCloseToExact()
    {
        // Cubic interpolation on a 1e-3 grid: error O(h⁴ K); measured 5e-7 mag for this template; checked off-grid.
        var kc = new TemplateKCorrection(BumpyTemplate(), R, B);
        Assert.True(KCorrectionGrid.TryTabulate(kc.TryEvaluate, 0.05, 1.5, 1e-3, out var grid, out _));
        foreach (double z in new[] { 0.05, 0.1234567, 0.77777, 1.3141, 1.5 })
            Assert.Equal(kc.Evaluate(z), grid!.At(z), 2e-6);
        Assert.False(KCorrectionGrid.TryTabulate(kc.TryEvaluate, 0.1, 50, 0.5, out var none, out double failed));
        Assert.Null(none);
        Assert.True(failed > kc.MaxRedshift);
    }

    [Fact]
    public void PivotWavelengthOfTopHat()
    {
        // λ_p² = ∫λ dλ / ∫dλ/λ = (b² − a²) / (2 ln(b/a)) for a flat band [a, b] (closed form of the pivot definition);
        // the 0.1 % edges of TopHat shift it by < 1e-3 relative.
        var f = FilterResponse.TopHat(5000, 6000);
        double expected = Math.Sqrt((6000.0 * 6000 - 5000.0 * 5000) / (2 * Math.Log(1.2)));
        Assert.Equal(expected, f.PivotWavelengthAngstrom, expected * 1e-3);
    }

    [Fact]
    public void TablesRejectBadColumns()
    {
        Assert.Throws<ArgumentException>(() => SpectralTable.FromColumns([1, 1], [1, 1], SpectralDensity.PerFrequency));
        Assert.Throws<ArgumentException>(() => SpectralTable.FromColumns([1, 2], [1, -1], SpectralDensity.PerFrequency));
        Assert.Throws<ArgumentException>(() => SpectralTable.FromColumns([1, 2], [0, 0], SpectralDensity.PerFrequency));
        Assert.Throws<ArgumentException>(() => FilterResponse.FromColumns([1, 2, 3], [0, 1], "x"));
        Assert.Throws<ArgumentException>(() => FilterResponse.FromColumns([1, 2], [0, 0], "x"));
    }
}

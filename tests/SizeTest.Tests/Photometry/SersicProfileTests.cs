using System.Globalization;
using SizeTest.Photometry;
using Xunit;

namespace SizeTest.Tests.Photometry;

public sealed class SersicProfileTests
{
    /// <summary>Ciotti &amp; Bertin 1999 (A&amp;A 352, 447), eq. 18 asymptotic series, truncated after the n⁻⁴ term.</summary>
    private static double CiottiBertin(double n) =>
        2 * n - 1.0 / 3 + 4 / (405 * n) + 46 / (25515 * n * n) + 131 / (1148175 * n * n * n)
        - 2194697 / (30690717750 * n * n * n * n);

    [Theory]
    [InlineData(0.5)] [InlineData(0.75)] [InlineData(1)] [InlineData(1.5)] [InlineData(2)] [InlineData(3)]
    [InlineData(4)] [InlineData(5)] [InlineData(6)] [InlineData(8)] [InlineData(10)]
    public void BnAgreesWithCiottiBertinSeries(double n)
    {
        double b = SersicProfile.Bn(n);
        // Asymptotic series (Ciotti & Bertin 1999): the truncated series misses terms that fall off
        // roughly as n⁻³ (measured with scipy 1.10.1: 4.2e-5 at n = 1, 5.4e-7 at n = 4, 3.3e-8 at n = 10);
        // tolerance 1e-4/n² for n ≥ 1, 5e-4 below (2.5e-4 residual at n = 0.5).
        double tol = n >= 1 ? 1e-4 / (n * n) : 5e-4;
        Assert.InRange(b - CiottiBertin(n), -tol, tol);
    }

    [Fact]
    public void BnMatchesScipyReferenceTable()
    {
        // Reference: scipy 1.10.1 gammaincinv (Reference/Photometry/sersic_bn_scipy.py).
        var path = Path.Combine(AppContext.BaseDirectory, "Reference", "Photometry", "sersic_bn_scipy.csv");
        int rows = 0;
        foreach (var line in File.ReadLines(path))
        {
            if (line.StartsWith('#') || line.StartsWith("n,")) continue;
            var f = line.Split(',');
            double n = double.Parse(f[0], CultureInfo.InvariantCulture), b = double.Parse(f[1], CultureInfo.InvariantCulture);
            Assert.Equal(b, SersicProfile.Bn(n), 1e-10 * b);
            rows++;
        }
        Assert.Equal(16, rows);
    }

    [Fact]
    public void CommonPracticeValuesAndExactHalfIndex()
    {
        Assert.Equal(1.678, SersicProfile.Bn(1), 3);   // common practice: b_1 ≈ 1.678
        Assert.Equal(7.669, SersicProfile.Bn(4), 3);   // common practice: b_4 ≈ 7.669 (de Vaucouleurs)
        // Closed form: n = 1/2 gives P(1, b) = 1 − e^{−b} = 1/2, so b_{1/2} = ln 2 exactly.
        Assert.Equal(Math.Log(2), SersicProfile.Bn(0.5), 13);
    }

    [Theory]
    [InlineData(0.5)] [InlineData(1)] [InlineData(2.5)] [InlineData(4)] [InlineData(8)]
    public void HalfTheLightInsideReByNumericalIntegration(double n)
    {
        // Direct quadrature of L(<R) = ∫ I(R) 2πR dR with R = R_e t^n (so the integrand is smooth):
        // I ∝ exp(−b t), 2πR dR ∝ 2π n t^{2n−1} dt; inside R_e: t ∈ [0,1]; total: t ∈ [0, ∞).
        double b = SersicProfile.Bn(n);
        double Integrand(double t) => n * Math.Pow(t, 2 * n - 1) * Math.Exp(-b * (t - 1));
        double inside = Composite(Integrand, 0, 1, 20000);
        double total = inside + Composite(Integrand, 1, 1 + 60.0 / b * Math.Max(1, n), 200000);
        Assert.Equal(0.5, inside / total, 6);            // definition of R_e (Graham & Driver 2005, eq. 4)
        Assert.Equal(0.5, SersicProfile.EnclosedLightFraction(n, 1.0), 12);
    }

    [Theory]
    [InlineData(0.5)] [InlineData(1)] [InlineData(2)] [InlineData(4)] [InlineData(10)]
    public void MeanMinusEffectiveByNumericalIntegration(double n)
    {
        // ⟨I⟩_e = L(<R_e)/(π R_e²) = I_e ∫0^1 2 n t^{2n−1} e^{−b(t−1)} dt (R = R_e t^n), so
        // ⟨μ⟩_e − μ_e = −2.5 log10 of that integral; compare with Graham & Driver 2005, eq. 9.
        double b = SersicProfile.Bn(n);
        double ratio = Composite(t => 2 * n * Math.Pow(t, 2 * n - 1) * Math.Exp(-b * (t - 1)), 0, 1, 20000);
        Assert.Equal(-2.5 * Math.Log10(ratio), SersicProfile.MeanMinusEffective(n), 6);
    }

    [Fact]
    public void KnownOffsetsForExponentialAndDeVaucouleurs()
    {
        // Graham & Driver 2005 eq. 9 evaluated with scipy 1.10.1 (gammaincinv, gammaln):
        // ⟨μ⟩_e − μ_e = −0.69783 (n = 1) and −1.39295 (n = 4).
        Assert.Equal(-0.69783, SersicProfile.MeanMinusEffective(1), 5);
        Assert.Equal(-1.39295, SersicProfile.MeanMinusEffective(4), 5);
        // μ_0 − μ_e = −2.5 b_n/ln10: −1.822 for n = 1 (1.0857 × 1.6783) and −8.327 for n = 4 (1.0857 × 7.6692), closed form.
        Assert.Equal(-1.8222, SersicProfile.CentralMinusEffective(1), 4);
        Assert.Equal(-8.3268, SersicProfile.CentralMinusEffective(4), 4);
    }

    [Fact]
    public void ProfileAtReAndCentre()
    {
        // μ(R_e) = μ_e and μ(0) = μ_e − 2.5 b_n/ln10 (Graham & Driver 2005, eq. 5).
        Assert.Equal(22.0, SersicProfile.SurfaceBrightnessAt(2.0, 22.0, 1.0), 12);
        Assert.Equal(22.0 + SersicProfile.CentralMinusEffective(2.0), SersicProfile.SurfaceBrightnessAt(2.0, 22.0, 0.0), 12);
    }

    [Fact]
    public void RejectsInvalidIndex()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => SersicProfile.Bn(0));
        Assert.Throws<ArgumentOutOfRangeException>(() => SersicProfile.Bn(double.NaN));
        Assert.Throws<ArgumentOutOfRangeException>(() => SersicProfile.Bn(100));
    }

    [Fact]
    public void SurfaceBrightnessDefinitions()
    {
        // ⟨μ⟩_e = m + 2.5 log10(2π R_e²): m = 20, R_e = 1″ → 20 + 2.5 log10(2π) = 21.995450 (closed form).
        Assert.Equal(20 + 2.5 * Math.Log10(2 * Math.PI), SurfaceBrightness.MeanWithinEffective(20, 1), 12);
        Assert.Equal(21.995450, SurfaceBrightness.MeanWithinEffective(20, 1), 5);
        // Conversions compose: mean → central = (μ_0 − μ_e) − (⟨μ⟩_e − μ_e).
        double off = SurfaceBrightness.ConversionOffset(SurfaceBrightnessKind.MeanWithinEffective, SurfaceBrightnessKind.Central, 4);
        Assert.Equal(SersicProfile.CentralMinusEffective(4) - SersicProfile.MeanMinusEffective(4), off, 12);
        Assert.Equal(0, SurfaceBrightness.ConversionOffset(SurfaceBrightnessKind.Central, SurfaceBrightnessKind.Central, 4));
    }

    /// <summary>Composite Simpson with m (even) panels.</summary>
    internal static double Composite(Func<double, double> f, double a, double b, int m)
    {
        double h = (b - a) / m, s = f(a) + f(b);
        for (int k = 1; k < m; k++) s += (k % 2 == 1 ? 4 : 2) * f(a + k * h);
        return s * h / 3;
    }
}

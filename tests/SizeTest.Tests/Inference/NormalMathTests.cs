using SizeTest.Inference;
using Xunit;

namespace SizeTest.Tests.Inference;

public sealed class NormalMathTests
{
    [Theory]
    // Φ(0) = 1/2 exactly; Φ(1.959963984540054) = 0.975 (definition of the 97.5% quantile, common tables);
    // Φ(−1) = 0.15865525393145707 (scipy.stats.norm.cdf(-1), scipy 1.10.1).
    [InlineData(0.0, 0.5)]
    [InlineData(1.959963984540054, 0.975)]
    [InlineData(-1.0, 0.15865525393145707)]
    public void LogPhiMatchesKnownValues(double x, double phi) =>
        Assert.Equal(Math.Log(phi), NormalMath.LogPhi(x), 12);

    [Fact]
    public void LogPhiIsContinuousAcrossItsBranches()
    {
        // The three branches meet at −30 and 5; the asymptotic series (Abramowitz & Stegun 26.2.12) and erfc
        // must agree there. Each side is taken 1e-9 from the joint, which alone moves ln Φ by |d ln Φ/dx|·2e-9
        // (d ln Φ/dx = φ/Φ): ≈ 30·2e-9 = 6e-8 at −30 and ≈ 1.5e-6·2e-9 = 3e-15 at 5 (closed form). Checked:
        // |Δ| ≤ 5e-7 absolute at −30 (1.1e-9 of |ln Φ(−30)| ≈ 454) and ≤ 5e-13 absolute at 5.
        double low = NormalMath.LogPhi(-30.0 + 1e-9) - NormalMath.LogPhi(-30.0 - 1e-9);
        Assert.True(Math.Abs(low) <= 5e-7, $"branch step at −30: {low:R}");
        double high = NormalMath.LogPhi(5.0 - 1e-9) - NormalMath.LogPhi(5.0 + 1e-9);
        Assert.True(Math.Abs(high) <= 5e-13, $"branch step at 5: {high:R}");
        // ln Φ(−40) ≈ −40²/2 − ln 40 − ln√(2π) + ln(1 − 1/x² + 3/x⁴ − 15/x⁶) (asymptotic series, derived).
        Assert.Equal(-800 - Math.Log(40) - 0.5 * Math.Log(2 * Math.PI) + Math.Log(1 - 1.0 / 1600 + 3.0 / 1600 / 1600 - 15.0 / 1600 / 1600 / 1600), NormalMath.LogPhi(-40), 9);
    }

    [Theory]
    [InlineData(0.5)]
    [InlineData(-0.5)]
    [InlineData(0.95)]
    [InlineData(-0.97)]
    [InlineData(0.1)]
    public void BivariateAtOriginMatchesSheppard(double rho) =>
        // Φ₂(0, 0; ρ) = 1/4 + asin(ρ)/(2π) (Sheppard 1898, closed form).
        Assert.Equal(0.25 + Math.Asin(rho) / (2 * Math.PI), NormalMath.BivariatePhi(0, 0, rho), 12);

    [Theory]
    [InlineData(0.3, -1.2, 0.0)]
    [InlineData(1.1, 0.4, 0.6)]
    [InlineData(-0.7, 2.0, -0.8)]
    [InlineData(-1.5, -0.2, 0.95)]
    [InlineData(2.5, -2.0, -0.96)]
    public void BivariateMatchesConditionalIntegral(double h, double k, double rho)
    {
        // Oracle: Φ₂(h,k;ρ) = ∫_{−∞}^{h} φ(x) Φ((k − ρx)/√(1−ρ²)) dx (conditioning; derived), Simpson on [−12, h].
        int n = 20000;
        double a = -12, step = (h - a) / n, s = 0, sd = Math.Sqrt(1 - rho * rho);
        double F(double x) => Math.Exp(-0.5 * x * x) / Math.Sqrt(2 * Math.PI) * NormalMath.Phi((k - rho * x) / sd);
        for (int i = 0; i <= n; i++) s += (i == 0 || i == n ? 1 : i % 2 == 1 ? 4 : 2) * F(a + i * step);
        Assert.Equal(s * step / 3, NormalMath.BivariatePhi(h, k, rho), 9);
    }
}

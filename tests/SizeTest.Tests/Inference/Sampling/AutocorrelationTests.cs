using SizeTest.Inference.Sampling;
using Xunit;

namespace SizeTest.Tests.Inference.Sampling;

public sealed class AutocorrelationTests
{
    // AR(1) with coefficient ρ: ρ(t) = ρ^t, so τ = 1 + 2 Σ_{t≥1} ρ^t = (1+ρ)/(1−ρ) (closed form, common practice).
    // Sokal (1997) gives var(τ̂)/τ² ≈ 2(2M+1)/N for window M; with M ≈ 5τ and N = 32 × 20000 the
    // relative standard error is ≤ 3% for τ ≤ 19, so 12% is a 4σ bound. The windowing bias
    // 2ρ^(M+1)/(1−ρ) relative to τ is < 1e-3 here.
    [Theory]
    [InlineData(0.0, 1.0)]
    [InlineData(0.5, 3.0)]
    [InlineData(0.9, 19.0)]
    public void RecoversKnownTimeOfAr1Chains(double rho, double expectedTau)
    {
        var chains = SyntheticChains.Ar1(32, 20000, rho, seed: 100 + (int)(rho * 10));
        var estimate = Autocorrelation.IntegratedTime(chains);
        Assert.True(estimate.WindowReached);
        Assert.InRange(estimate.Tau, expectedTau * 0.88, expectedTau * 1.12);
        Assert.True(estimate.LengthInTau > 50);
    }

    [Fact]
    public void SingleSeriesAgreesWithClosedForm()
    {
        // One long series: N = 200000, ρ = 0.8, τ = 9; relative SE √(2(2·45+1)/2e5) ≈ 3%, bound 15% (5σ).
        var x = SyntheticChains.Ar1(1, 200000, 0.8, seed: 5)[0];
        var estimate = Autocorrelation.IntegratedTime(x);
        Assert.InRange(estimate.Tau, 9.0 * 0.85, 9.0 * 1.15);
    }

    [Fact]
    public void AutocovarianceMatchesDirectSum()
    {
        var rng = new Random(1);
        var x = Enumerable.Range(0, 37).Select(_ => rng.NextDouble()).ToArray();
        var fft = Autocorrelation.Autocovariance(x);
        double mean = x.Average();
        for (int t = 0; t < x.Length; t++)
        {
            double direct = 0;
            for (int i = 0; i + t < x.Length; i++) direct += (x[i] - mean) * (x[i + t] - mean);
            direct /= x.Length;   // biased estimator, definition in the method's documentation
            Assert.Equal(direct, fft[t], 12);
        }
        Assert.Equal(1.0, Autocorrelation.Function(x)[0], 14);
    }

    [Fact]
    public void PairedFftAutocovariancesMatchDirectSums()
    {
        // Two real series packed into one complex FFT must give each series' own autocovariance
        // (definition: biased sum, checked against the direct O(n²) sum; lengths 1, 2, odd and a power of two).
        foreach (int n in new[] { 1, 2, 37, 64 })
        {
            var rng = new Random(n);
            var x = Enumerable.Range(0, n).Select(_ => rng.NextDouble()).ToArray();
            var y = Enumerable.Range(0, n).Select(_ => 5 * rng.NextDouble() - 2).ToArray();
            var ax = new double[n];
            var ay = new double[n];
            Fft.AutocovariancePair(x, y, ax, ay);
            foreach (var (series, fft) in new[] { (x, ax), (y, ay) })
            {
                double mean = series.Average();
                for (int t = 0; t < n; t++)
                {
                    double direct = 0;
                    for (int i = 0; i + t < n; i++) direct += (series[i] - mean) * (series[i + t] - mean);
                    Assert.Equal(direct / n, fft[t], 12);
                }
            }
        }
    }

    [Fact]
    public void ShortChainDoesNotReachWindow()
    {
        // ρ = 0.99 (τ = 199) in 300 steps: no M < 300 satisfies M ≥ 5τ, so the estimate must say so.
        var chains = SyntheticChains.Ar1(4, 300, 0.99, seed: 2);
        var estimate = Autocorrelation.IntegratedTime(chains);
        Assert.True(!estimate.WindowReached || estimate.LengthInTau < 50, $"tau {estimate.Tau} window {estimate.Window}");
    }

    [Fact]
    public void ConstantSeriesNeverDecorrelates()
    {
        var rho = Autocorrelation.Function(Enumerable.Repeat(3.0, 10).ToArray());
        Assert.All(rho, r => Assert.Equal(1.0, r));
        Assert.False(Autocorrelation.IntegratedTime(Enumerable.Repeat(3.0, 10).ToArray()).WindowReached);
    }
}

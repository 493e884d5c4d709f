using Xunit;
namespace SizeTest.Tests.Simulation;

/// <summary>Sample statistics and the 4σ sampling bounds used by the simulation tests.</summary>
internal static class MockStats
{
    public static (double Mean, double Sd) MeanSd(IReadOnlyList<double> x)
    {
        double m = x.Average();
        double v = x.Sum(t => (t - m) * (t - m)) / (x.Count - 1);
        return (m, Math.Sqrt(v));
    }

    public static double Correlation(IReadOnlyList<double> x, IReadOnlyList<double> y)
    {
        double mx = x.Average(), my = y.Average(), sxy = 0, sxx = 0, syy = 0;
        for (int i = 0; i < x.Count; i++)
        {
            sxy += (x[i] - mx) * (y[i] - my);
            sxx += (x[i] - mx) * (x[i] - mx);
            syy += (y[i] - my) * (y[i] - my);
        }
        return sxy / Math.Sqrt(sxx * syy);
    }

    /// <summary>
    /// Asserts that a sample of n normal deviates with true mean mu and sd sigma has sample mean within
    /// 4 σ/√n and sample sd within 4 σ/√(2(n−1)) (the large-n standard error of a normal sample's sd;
    /// common practice) of the truth.
    /// </summary>
    public static void AssertNormalMoments(IReadOnlyList<double> x, double mu, double sigma, string what)
    {
        var (m, s) = MeanSd(x);
        int n = x.Count;
        double meanTol = 4 * sigma / Math.Sqrt(n), sdTol = 4 * sigma / Math.Sqrt(2.0 * (n - 1));
        Assert.True(Math.Abs(m - mu) < meanTol, $"{what}: mean {m} differs from {mu} by more than 4σ ({meanTol})");
        Assert.True(Math.Abs(s - sigma) < sdTol, $"{what}: sd {s} differs from {sigma} by more than 4σ ({sdTol})");
    }
}

using MathNet.Numerics.LinearAlgebra;
using SizeTest.Inference;

namespace SizeTest.Tests.Inference.Sampling;

/// <summary>Multivariate Gaussian log density (normalised), for sampler tests.</summary>
internal sealed class GaussianDensity : ILogDensity
{
    private readonly double[] _mean;
    private readonly double[,] _precision;
    private readonly double _logNorm;

    public GaussianDensity(double[] mean, double[,] covariance)
    {
        _mean = mean;
        var cov = Matrix<double>.Build.DenseOfArray(covariance);
        _precision = cov.Inverse().ToArray();
        _logNorm = -0.5 * (mean.Length * Math.Log(2 * Math.PI) + Math.Log(cov.Determinant()));
        Covariance = covariance;
    }

    public double[,] Covariance { get; }
    public double[] Mean => _mean;
    public int Dimension => _mean.Length;

    public double LogDensity(ReadOnlySpan<double> theta)
    {
        int d = _mean.Length;
        Span<double> r = stackalloc double[d];
        for (int i = 0; i < d; i++) r[i] = theta[i] - _mean[i];
        double q = 0;
        for (int i = 0; i < d; i++)
        {
            double s = 0;
            for (int j = 0; j < d; j++) s += _precision[i, j] * r[j];
            q += r[i] * s;
        }
        return _logNorm - 0.5 * q;
    }
}

/// <summary>A density returning a fixed value (to test refusals).</summary>
internal sealed class ConstantDensity(int dimension, double value) : ILogDensity
{
    public int Dimension => dimension;
    public double LogDensity(ReadOnlySpan<double> theta) => value;
}

/// <summary>Wraps a delegate as a density.</summary>
internal sealed class DelegateDensity(int dimension, Func<double[], double> f) : ILogDensity
{
    public int Dimension => dimension;
    public double LogDensity(ReadOnlySpan<double> theta) => f(theta.ToArray());
}

/// <summary>Records every progress report synchronously.</summary>
internal sealed class ListProgress<T> : IProgress<T>
{
    public List<T> Reports { get; } = [];
    public void Report(T value) { lock (Reports) Reports.Add(value); }
}

internal static class SyntheticChains
{
    /// <summary>
    /// Stationary AR(1) chains x_t = ρ x_{t−1} + √(1−ρ²) ε_t, ε ~ N(0,1), unit marginal variance;
    /// integrated autocorrelation time τ = (1+ρ)/(1−ρ) (closed form: ρ(t) = ρ^t, 1 + 2Σ ρ^t).
    /// </summary>
    public static double[][] Ar1(int chains, int length, double rho, int seed, double shift = 0, double scale = 1)
    {
        var rng = new Random(seed);
        var result = new double[chains][];
        double s = Math.Sqrt(1 - rho * rho);
        for (int c = 0; c < chains; c++)
        {
            var x = new double[length];
            double prev = Normal(rng);
            for (int t = 0; t < length; t++)
            {
                prev = rho * prev + s * Normal(rng);
                x[t] = shift + scale * prev;
            }
            result[c] = x;
        }
        return result;
    }

    public static double Normal(Random rng)
    {
        double u1 = 1.0 - rng.NextDouble(), u2 = rng.NextDouble();
        return Math.Sqrt(-2.0 * Math.Log(u1)) * Math.Cos(2.0 * Math.PI * u2);
    }
}

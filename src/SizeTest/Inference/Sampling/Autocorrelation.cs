namespace SizeTest.Inference.Sampling;

/// <summary>
/// Integrated autocorrelation time τ = 1 + 2 Σ_{t≥1} ρ(t) of a Markov chain, with the
/// normalised autocorrelation ρ(t) computed by FFT (zero-padded to avoid wrap-around; own radix-2 transform) and the
/// sum cut at Sokal's automatic window: the smallest M with M ≥ c·τ̂(M), c = 5 by default
/// (Sokal 1997, "Monte Carlo methods in statistical mechanics", in Functional Integration,
/// NATO ASI Series B 361, §3; Goodman &amp; Weare 2010 §5 for its use with ensembles).
/// For an ensemble the autocorrelation functions of the walkers are averaged before the window
/// is applied, the usual practice for affine-invariant samplers.
/// </summary>
public static class Autocorrelation
{
    /// <summary>Default window constant c of Sokal's automatic windowing.</summary>
    public const double DefaultWindowConstant = 5.0;

    /// <summary>
    /// Normalised autocorrelation function ρ(t), t = 0 … n−1, of one series, from the biased
    /// autocovariance (divided by n) so that ρ(0) = 1. A constant series has ρ(t) = 1 for all t
    /// (it never decorrelates).
    /// </summary>
    public static double[] Function(ReadOnlySpan<double> series)
    {
        int n = series.Length;
        var rho = new double[n];
        if (n == 0) return rho;
        var acov = Autocovariance(series);
        if (!(acov[0] > 0))
        {
            Array.Fill(rho, 1.0);
            return rho;
        }
        for (int t = 0; t < n; t++) rho[t] = acov[t] / acov[0];
        return rho;
    }

    /// <summary>
    /// Biased autocovariance γ(t) = (1/n) Σ_{i=0}^{n−1−t} (x_i − x̄)(x_{i+t} − x̄), t = 0 … n−1,
    /// by FFT in O(n log n).
    /// </summary>
    public static double[] Autocovariance(ReadOnlySpan<double> series)
    {
        var result = new double[series.Length];
        Fft.AutocovariancePair(series, [], result, []);
        return result;
    }

    /// <summary>τ of a single series (see the class remarks).</summary>
    /// <param name="series">The chain of one parameter.</param>
    /// <param name="windowConstant">Sokal's c (default 5).</param>
    public static IntegratedTimeEstimate IntegratedTime(ReadOnlySpan<double> series, double windowConstant = DefaultWindowConstant)
        => Windowed(Function(series), series.Length, windowConstant);

    /// <summary>
    /// τ of an ensemble: the walkers' autocorrelation functions are averaged, then windowed.
    /// </summary>
    /// <param name="walkers">One series per walker, all of the same length.</param>
    /// <param name="windowConstant">Sokal's c (default 5).</param>
    /// <exception cref="ArgumentException">When there are no walkers or their lengths differ.</exception>
    public static IntegratedTimeEstimate IntegratedTime(IReadOnlyList<double[]> walkers, double windowConstant = DefaultWindowConstant)
    {
        if (walkers.Count == 0) throw new ArgumentException("At least one walker series is needed.", nameof(walkers));
        int n = walkers[0].Length;
        var mean = new double[n];
        foreach (var w in walkers)
            if (w.Length != n) throw new ArgumentException("All walker series must have the same length.", nameof(walkers));
        var ax = new double[n];
        var ay = new double[n];
        for (int k = 0; k < walkers.Count; k += 2)
        {
            bool pair = k + 1 < walkers.Count;
            Fft.AutocovariancePair(walkers[k], pair ? walkers[k + 1] : [], ax, pair ? ay : []);
            AddNormalised(ax, mean);
            if (pair) AddNormalised(ay, mean);
        }
        for (int t = 0; t < n; t++) mean[t] /= walkers.Count;
        return Windowed(mean, n, windowConstant);
    }

    /// <summary>Adds ρ(t) = γ(t)/γ(0) to <paramref name="sum"/> (ρ ≡ 1 for a constant series, which never decorrelates).</summary>
    private static void AddNormalised(double[] acov, double[] sum)
    {
        if (!(acov[0] > 0))
        {
            for (int t = 0; t < sum.Length; t++) sum[t] += 1.0;
            return;
        }
        double inv = 1.0 / acov[0];
        for (int t = 0; t < sum.Length; t++) sum[t] += acov[t] * inv;
    }

    private static IntegratedTimeEstimate Windowed(double[] rho, int n, double c)
    {
        if (!(c > 0)) throw new ArgumentOutOfRangeException(nameof(c), c, "The window constant must be positive.");
        if (n < 2) return new IntegratedTimeEstimate(double.NaN, 0, n, false);
        // τ(M) = 1 + 2 Σ_{t=1}^{M} ρ(t); smallest M with M ≥ c τ(M).
        double tau = 1.0;
        for (int m = 1; m < n; m++)
        {
            tau += 2.0 * rho[m];
            if (m >= c * tau) return new IntegratedTimeEstimate(tau, m, n, true);
        }
        return new IntegratedTimeEstimate(tau, n - 1, n, false);
    }
}

/// <summary>An integrated autocorrelation time estimate.</summary>
/// <param name="Tau">τ in steps (NaN for fewer than two samples).</param>
/// <param name="Window">Summation window M.</param>
/// <param name="Length">Length of the series (steps).</param>
/// <param name="WindowReached">False when no M &lt; n satisfied M ≥ c·τ(M): the chain is too short and τ is a lower bound.</param>
public sealed record IntegratedTimeEstimate(double Tau, int Window, int Length, bool WindowReached)
{
    /// <summary>Chain length in units of τ (n/τ); the usual requirement is ≥ 50.</summary>
    public double LengthInTau => Length / Tau;
}

using SizeTest.Photometry;

namespace SizeTest.Inference;

/// <summary>Bootstrap percentile interval of one parameter.</summary>
/// <param name="Name">Parameter name.</param>
/// <param name="Median">Median over resamples.</param>
/// <param name="Lo">16th percentile.</param>
/// <param name="Hi">84th percentile.</param>
/// <param name="Sd">Standard deviation over resamples.</param>
public sealed record BootstrapInterval(string Name, double Median, double Lo, double Hi, double Sd);

/// <summary>Outcome of a bootstrap of one model.</summary>
/// <param name="Model">Model name.</param>
/// <param name="Resamples">Resamples requested.</param>
/// <param name="Failed">Resamples whose refit did not converge (excluded from the intervals).</param>
/// <param name="Intervals">Per free parameter.</param>
public sealed record BootstrapResult(string Model, int Resamples, int Failed, IReadOnlyList<BootstrapInterval> Intervals);

/// <summary>
/// Nonparametric bootstrap (Efron 1979) in its Poisson form: replicate b weights every object by a Poisson(1) count
/// drawn from (seed, b, row identity) (<see cref="PoissonBootstrapWeights"/>), refits, and takes percentiles of the
/// refitted parameters. The weights do not depend on the number of threads or MPI ranks.
/// </summary>
public static class Bootstrap
{
    /// <summary>Runs <paramref name="resamples"/> refits in parallel, starting each from <paramref name="best"/>.</summary>
    /// <param name="hypothesis">The hypothesis.</param>
    /// <param name="observables">The full sample.</param>
    /// <param name="best">The full-sample best fit (free parameters).</param>
    /// <param name="resamples">Number of resamples (≥ 1).</param>
    /// <param name="seed">Seed.</param>
    /// <param name="onDone">Called after each finished resample (from worker threads) with the count done so far.</param>
    /// <param name="maxDegreeOfParallelism">Thread cap (−1: all cores).</param>
    /// <param name="cancel">Cancellation.</param>
    public static BootstrapResult Run(Hypothesis hypothesis, Observables observables, double[] best, int resamples, int seed,
        Action<int>? onDone = null, int maxDegreeOfParallelism = -1, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(observables);
        _ = maxDegreeOfParallelism; // the in-process backend uses every core
        return Run(Evaluation.EvaluationBackend.InProcess(observables), hypothesis, best, resamples, seed, onDone, cancel);
    }

    /// <summary>Runs <paramref name="resamples"/> refits on <paramref name="backend"/> (concurrently in one process, in
    /// order under MPI), each a one-start refit from <paramref name="best"/>.</summary>
    /// <param name="backend">Where the sums are evaluated.</param>
    /// <param name="hypothesis">The hypothesis.</param>
    /// <param name="best">The full-sample best fit (free parameters).</param>
    /// <param name="resamples">Number of resamples (≥ 1).</param>
    /// <param name="seed">Seed.</param>
    /// <param name="onDone">Called after each finished resample with the count done so far.</param>
    /// <param name="cancel">Cancellation.</param>
    public static BootstrapResult Run(Evaluation.EvaluationBackend backend, Hypothesis hypothesis, double[] best, int resamples, int seed,
        Action<int>? onDone = null, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(backend);
        ArgumentNullException.ThrowIfNull(hypothesis);
        ArgumentNullException.ThrowIfNull(best);
        if (resamples < 1) throw new ArgumentOutOfRangeException(nameof(resamples), "the bootstrap needs at least one resample");
        int d = hypothesis.K;
        var thetas = new double[resamples][];
        var ok = new bool[resamples];
        int done = 0;
        var settings = new OptimizerSettings(Starts: 1, Tolerance: 1e-9, InitialStep: 0.1);
        var ids = backend.RowIds;
        backend.ForEach(resamples, i =>
        {
            var weights = new int[ids.Count];
            for (int r = 0; r < weights.Length; r++) weights[r] = PoissonBootstrapWeights.Weight(seed, i, ids[r]);
            var lik = backend.Bind(hypothesis, weights);
            var fit = MaximumLikelihood.Fit(lik, lik.Posterior, hypothesis.FreeParameters, best, settings, covariance: false);
            thetas[i] = fit.Theta;
            ok[i] = fit.Converged;
            onDone?.Invoke(Interlocked.Increment(ref done));
        }, cancel);
        var good = Enumerable.Range(0, resamples).Where(i => ok[i]).Select(i => thetas[i]).ToArray();
        var intervals = new List<BootstrapInterval>();
        for (int j = 0; j < d; j++)
        {
            var col = good.Select(t => t[j]).OrderBy(v => v).ToArray();
            if (col.Length == 0) { intervals.Add(new BootstrapInterval(hypothesis.FreeParameters[j].Name, double.NaN, double.NaN, double.NaN, double.NaN)); continue; }
            double mean = col.Average();
            double sd = col.Length > 1 ? Math.Sqrt(col.Sum(v => (v - mean) * (v - mean)) / (col.Length - 1)) : double.NaN;
            intervals.Add(new BootstrapInterval(hypothesis.FreeParameters[j].Name, Quantile(col, 0.5), Quantile(col, 0.16), Quantile(col, 0.84), sd));
        }
        return new BootstrapResult(hypothesis.Label, resamples, resamples - good.Length, intervals);
    }

    /// <summary>Linear-interpolation quantile of sorted values (type 7, Hyndman &amp; Fan 1996).</summary>
    public static double Quantile(IReadOnlyList<double> sorted, double q)
    {
        if (sorted.Count == 0) return double.NaN;
        double h = (sorted.Count - 1) * q;
        int lo = (int)Math.Floor(h);
        int hi = Math.Min(lo + 1, sorted.Count - 1);
        return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
    }
}

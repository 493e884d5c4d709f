using SizeTest.Photometry;

namespace SizeTest.Inference;

/// <summary>k-fold cross-validated log predictive density of one model.</summary>
/// <param name="Model">Model name.</param>
/// <param name="Folds">k.</param>
/// <param name="LogPredictiveDensity">Σ over folds of ln p(held-out fold | θ̂ fitted to the other folds) (plug-in).</param>
/// <param name="StandardError">√k × the standard deviation of the per-fold sums (Vehtari, Gelman &amp; Gabry 2017, eq. 23 applied to folds).</param>
/// <param name="FailedFolds">Folds whose training fit did not converge.</param>
public sealed record CrossValidationResult(string Model, int Folds, double LogPredictiveDensity, double StandardError, int FailedFolds);

/// <summary>k-fold cross-validation with a seeded random partition of the objects.</summary>
public static class CrossValidation
{
    /// <summary>Runs k-fold cross-validation of <paramref name="hypothesis"/> in this process.</summary>
    public static CrossValidationResult Run(Hypothesis hypothesis, Observables observables, int folds, int seed, double[]? start = null)
    {
        ArgumentNullException.ThrowIfNull(observables);
        return Run(Evaluation.EvaluationBackend.InProcess(observables), hypothesis, folds, seed, start);
    }

    /// <summary>
    /// Runs k-fold cross-validation of <paramref name="hypothesis"/> on <paramref name="backend"/>. The partition is a
    /// seeded random permutation of the whole sample's positions (object at position r of the permutation goes to fold
    /// r mod k), so it depends on the seed and the sample only, never on the number of threads or ranks.
    /// </summary>
    /// <param name="backend">Where the sums are evaluated.</param>
    /// <param name="hypothesis">The hypothesis.</param>
    /// <param name="folds">k (2 … n).</param>
    /// <param name="seed">Seed of the partition.</param>
    /// <param name="start">Start of each training fit (default: the backend's data-driven start).</param>
    public static CrossValidationResult Run(Evaluation.EvaluationBackend backend, Hypothesis hypothesis, int folds, int seed, double[]? start = null)
    {
        ArgumentNullException.ThrowIfNull(backend);
        ArgumentNullException.ThrowIfNull(hypothesis);
        int n = backend.TotalObjects;
        if (folds < 2 || folds > n) throw new ArgumentOutOfRangeException(nameof(folds), $"cross-validation needs 2 to {n} folds");
        var foldOf = FoldsOfLocalRows(backend, folds, seed);
        start ??= backend.SuggestStart(hypothesis);
        var sums = new double[folds];
        var failed = new bool[folds];
        backend.ForEach(folds, f =>
        {
            var train = Array.ConvertAll(foldOf, k => k != f ? 1 : 0);
            var test = Array.ConvertAll(foldOf, k => k == f ? 1 : 0);
            var lik = backend.Bind(hypothesis, train);
            var fit = MaximumLikelihood.Fit(lik, lik.Posterior, hypothesis.FreeParameters, start, new OptimizerSettings(Starts: 1), covariance: false);
            failed[f] = !fit.Converged;
            sums[f] = backend.Bind(hypothesis, test).LogDensity(fit.Theta);
        });
        double total = sums.Sum(), mean = total / folds;
        double sd = Math.Sqrt(sums.Sum(s => (s - mean) * (s - mean)) / (folds - 1));
        return new CrossValidationResult(hypothesis.Label, folds, total, Math.Sqrt(folds) * sd, failed.Count(b => b));
    }

    // Fold of each local object: a seeded permutation of the whole sample's positions 0 … n−1.
    private static int[] FoldsOfLocalRows(Evaluation.EvaluationBackend backend, int folds, int seed)
    {
        int n = backend.TotalObjects;
        var rng = new Random(seed);
        var perm = Enumerable.Range(0, n).ToArray();
        rng.Shuffle(perm);
        var local = new int[backend.Local.Count];
        long first = backend.FirstIndex, end = first + local.Length;
        for (int r = 0; r < n; r++)
            if (perm[r] >= first && perm[r] < end) local[perm[r] - first] = r % folds;
        return local;
    }
}

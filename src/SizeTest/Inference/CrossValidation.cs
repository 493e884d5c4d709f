using SizeTest.Foundation.Randomness;
using SizeTest.Photometry;
using SizeTest.Inference.Comparison;

namespace SizeTest.Inference;

/// <summary>k-fold cross-validated log predictive density of one model.</summary>
/// <param name="Model">Model name.</param>
/// <param name="Folds">k.</param>
/// <param name="LogPredictiveDensity">Σ over folds of ln p(held-out fold | θ̂ fitted to the other folds) (plug-in).</param>
/// <param name="StandardError">√k × the standard deviation of the per-fold sums (Vehtari, Gelman &amp; Gabry 2017, eq. 23 applied to folds).</param>
/// <param name="FailedFolds">Folds whose training fit did not converge.</param>
public sealed record CrossValidationResult(string Model, int Folds, double LogPredictiveDensity, double StandardError, int FailedFolds)
{
    /// <summary>The held-out ln p of each fold, in fold order (the folds are the same for every model of a study).</summary>
    public IReadOnlyList<double> FoldLogDensities { get; init; } = [];
}

/// <summary>
/// k-fold cross-validation with a seeded random partition of the objects. The partition depends only on the number of
/// objects, k and the seed (<see cref="AssignFolds"/>), so every model of a study is scored on the same folds and the
/// differences between models are paired (<see cref="CrossValidationComparison"/>).
/// </summary>
public static class CrossValidation
{
    /// <summary>The fold of each object: a seeded random permutation dealt round-robin into k folds (sizes differ by at most one).</summary>
    public static int[] AssignFolds(int n, int folds, int seed)
    {
        if (folds < 2 || folds > n) throw new ArgumentOutOfRangeException(nameof(folds), $"cross-validation needs 2 to {n} folds");
        var rng = SeededRandom.Create(seed);
        var perm = Enumerable.Range(0, n).ToArray();
        rng.Shuffle(perm);
        var foldOf = new int[n];
        for (int r = 0; r < n; r++) foldOf[perm[r]] = r % folds;
        return foldOf;
    }

    /// <summary>Runs k-fold cross-validation of <paramref name="hypothesis"/> on the folds <see cref="AssignFolds"/>(n, k, <paramref name="seed"/>).</summary>
    public static CrossValidationResult Run(Hypothesis hypothesis, Observables observables, int folds, int seed, double[]? start = null) =>
        Run(hypothesis, observables, AssignFolds(observables?.Count ?? 0, folds, seed), folds, start);

    /// <summary>From this many objects the folds of one process run one after another (memory: at most one fold's training copy at a time).</summary>
    public const int SequentialFoldsFrom = 100_000;

    /// <summary>Runs k-fold cross-validation of <paramref name="hypothesis"/> on a given fold assignment, in this process.</summary>
    public static CrossValidationResult Run(Hypothesis hypothesis, Observables observables, int[] foldOf, int folds, double[]? start = null)
    {
        ArgumentNullException.ThrowIfNull(observables);
        return Run(Evaluation.EvaluationBackend.InProcess(observables), hypothesis, foldOf, folds, start);
    }

    /// <summary>
    /// Runs k-fold cross-validation of <paramref name="hypothesis"/> on <paramref name="backend"/> (folds concurrently in
    /// one process, in order under MPI). <paramref name="foldOf"/> gives the fold of every object of the whole sample, by
    /// its position; each process reads its own rows' folds, so the folds do not depend on the number of ranks.
    /// </summary>
    /// <param name="backend">Where the rows are.</param>
    /// <param name="hypothesis">The hypothesis.</param>
    /// <param name="foldOf">The fold of every object of the whole sample.</param>
    /// <param name="folds">k.</param>
    /// <param name="start">Start of each training fit (default: the backend's data-driven start).</param>
    /// <param name="whole">The hypothesis already bound to the whole sample (<see cref="Evaluation.EvaluationBackend.Bind"/>
    /// without weights), if the caller has it: the folds are then masks over its rows (<see cref="Evaluation.RowSumLikelihood.Reweighted"/>).
    /// Null: it is bound here once.</param>
    public static CrossValidationResult Run(Evaluation.EvaluationBackend backend, Hypothesis hypothesis, int[] foldOf, int folds, double[]? start = null,
        Evaluation.RowSumLikelihood? whole = null)
    {
        ArgumentNullException.ThrowIfNull(backend);
        ArgumentNullException.ThrowIfNull(hypothesis);
        ArgumentNullException.ThrowIfNull(foldOf);
        int n = backend.TotalObjects;
        if (foldOf.Length != n) throw new ArgumentException($"the fold assignment has {foldOf.Length} entries for {n} objects", nameof(foldOf));
        var local = foldOf.AsSpan((int)backend.FirstIndex, backend.Local.Count).ToArray();
        start ??= backend.SuggestStart(hypothesis);
        var sums = new double[folds];
        var failed = new bool[folds];
        if (whole is not null && !ReferenceEquals(whole.Hypothesis, hypothesis)) throw new ArgumentException("the bound likelihood is of another hypothesis", nameof(whole));
        whole ??= backend.Bind(hypothesis);
        // Folds run concurrently in one process, except for large samples, where they run one after another (each
        // evaluation is still split over threads by chunks): a fold whose kernel cannot mask rows binds its own copy of
        // the training rows, and one at a time bounds memory.
        void Each(Action<int> body)
        {
            if (backend.Concurrent && n >= SequentialFoldsFrom) for (int f = 0; f < folds; f++) body(f);
            else backend.ForEach(folds, body);
        }
        Each(f =>
        {
            var train = Array.ConvertAll(local, k => k != f ? 1 : 0);
            var test = Array.ConvertAll(local, k => k == f ? 1 : 0);
            var lik = whole.Reweighted(train);
            var fit = MaximumLikelihood.Fit(lik, lik.Posterior, hypothesis.FreeParameters, start, new OptimizerSettings(Starts: 1), covariance: false);
            failed[f] = !fit.Converged;
            sums[f] = whole.Reweighted(test).LogDensity(fit.Theta);
        });
        double total = sums.Sum(), mean = total / folds;
        double sd = Math.Sqrt(sums.Sum(s => (s - mean) * (s - mean)) / (folds - 1));
        return new CrossValidationResult(hypothesis.Label, folds, total, Math.Sqrt(folds) * sd, failed.Count(b => b)) { FoldLogDensities = sums };
    }
}

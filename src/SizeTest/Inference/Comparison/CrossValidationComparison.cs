using SizeTest.Inference;

namespace SizeTest.Inference.Comparison;

/// <summary>
/// A paired difference of cross-validated log predictive densities (results.json <c>cross_validation_differences</c>).
/// </summary>
/// <param name="Model">The model compared.</param>
/// <param name="Reference">The model with the highest cross-validated ln p (the reference).</param>
/// <param name="Difference">Σ_f [ln p_f(model) − ln p_f(reference)] over the shared folds (≤ 0).</param>
/// <param name="StandardError">√k × the standard deviation of the per-fold differences (paired; Vehtari, Gelman &amp; Gabry
/// 2017, eq. 24, applied to folds).</param>
/// <param name="Folds">k.</param>
/// <param name="Tied">True when the difference is within <see cref="CrossValidationComparison.TieTolerance"/> (no order).</param>
public sealed record CrossValidationDifference(string Model, string Reference, double Difference, double StandardError, int Folds, bool Tied);

/// <summary>Paired comparison of models scored on the same cross-validation folds.</summary>
public static class CrossValidationComparison
{
    /// <summary>Two models whose cross-validated ln p differ by less than this tie (the optimiser's agreement
    /// tolerance in ln L, <see cref="OptimizerSettings.AgreementTolerance"/>).</summary>
    public const double TieTolerance = 0.01;

    /// <summary>
    /// The difference of every other model from the best-scoring one (ties broken by name for the choice of the reference
    /// only). Results of different fold counts cannot be paired and give an empty list.
    /// </summary>
    public static IReadOnlyList<CrossValidationDifference> Compare(IReadOnlyList<CrossValidationResult> results)
    {
        ArgumentNullException.ThrowIfNull(results);
        var usable = results.Where(r => r.FoldLogDensities.Count == r.Folds && double.IsFinite(r.LogPredictiveDensity)).ToArray();
        if (usable.Length < 2 || usable.Select(r => r.Folds).Distinct().Count() != 1) return [];
        var reference = usable.OrderByDescending(r => r.LogPredictiveDensity).ThenBy(r => r.Model, StringComparer.Ordinal).First();
        var list = new List<CrossValidationDifference>();
        foreach (var r in usable)
        {
            if (ReferenceEquals(r, reference)) continue;
            int k = r.Folds;
            var d = new double[k];
            for (int f = 0; f < k; f++) d[f] = r.FoldLogDensities[f] - reference.FoldLogDensities[f];
            double total = d.Sum(), mean = total / k;
            double sd = Math.Sqrt(d.Sum(x => (x - mean) * (x - mean)) / (k - 1));
            list.Add(new CrossValidationDifference(r.Model, reference.Model, total, Math.Sqrt(k) * sd, k, Math.Abs(total) < TieTolerance));
        }
        return list;
    }
}

using SizeTest.Inference;

namespace SizeTest.Inference.Comparison;

/// <summary>Ranks fitted models by information criteria and evidence.</summary>
public static class ModelComparison
{
    /// <summary>
    /// Models whose AIC and BIC both agree within this many units share a rank (a tie). It is twice the optimiser's
    /// agreement tolerance in ln L (<see cref="OptimizerSettings.AgreementTolerance"/> = 0.01): two maxima closer than
    /// that are not resolved by the fits, and a difference of 0.02 in a criterion is far below any evidential threshold
    /// (Kass &amp; Raftery 1995 start at 2).
    /// </summary>
    public const double TieTolerance = 0.02;

    /// <summary>
    /// Fills ΔAIC, ΔBIC and Akaike weights w_i = exp(−ΔAIC_i/2) / Σ_j exp(−ΔAIC_j/2) (Akaike 1978;
    /// Burnham &amp; Anderson 2002, §2.9) and returns the models ordered by BIC (then AIC, then name), with
    /// <see cref="ModelFitSummary.Rank"/> filled: models whose AIC and BIC agree within <see cref="TieTolerance"/> of the
    /// first of their group share its rank, are flagged <see cref="ModelFitSummary.Tied"/>, and are listed by name (no
    /// order among them). Models whose ln L̂ is not finite get no weight and rank last.
    /// </summary>
    public static IReadOnlyList<ModelFitSummary> Rank(IReadOnlyList<ModelFitSummary> models)
    {
        ArgumentNullException.ThrowIfNull(models);
        if (models.Count == 0) return [];
        var finite = models.Where(m => double.IsFinite(m.Aic)).ToArray();
        double minAic = finite.Length > 0 ? finite.Min(m => m.Aic) : double.NaN;
        double minBic = finite.Length > 0 ? finite.Min(m => m.Bic) : double.NaN;
        double norm = finite.Sum(m => Math.Exp(-(m.Aic - minAic) / 2));
        var sorted = models
            .Select(m => m with
            {
                DeltaAic = m.Aic - minAic,
                DeltaBic = m.Bic - minBic,
                AkaikeWeight = double.IsFinite(m.Aic) ? Math.Exp(-(m.Aic - minAic) / 2) / norm : 0,
            })
            .OrderBy(m => double.IsFinite(m.Bic) ? m.Bic : double.MaxValue).ThenBy(m => m.Aic).ThenBy(m => m.Name, StringComparer.Ordinal)
            .ToArray();
        var result = new List<ModelFitSummary>(sorted.Length);
        int i = 0;
        while (i < sorted.Length)
        {
            var head = sorted[i];
            int end = i + 1;
            while (end < sorted.Length && Ties(head, sorted[end])) end++;
            bool tied = end - i > 1;
            int rank = i + 1;
            result.AddRange(sorted.Skip(i).Take(end - i).OrderBy(m => m.Name, StringComparer.Ordinal).Select(m => m with { Rank = rank, Tied = tied }));
            i = end;
        }
        return result;
    }

    /// <summary>Whether two models' AIC and BIC agree within <see cref="TieTolerance"/> (both finite).</summary>
    public static bool Ties(ModelFitSummary a, ModelFitSummary b)
    {
        ArgumentNullException.ThrowIfNull(a);
        ArgumentNullException.ThrowIfNull(b);
        return double.IsFinite(a.Bic) && double.IsFinite(b.Bic)
            && Math.Abs(a.Bic - b.Bic) <= TieTolerance && Math.Abs(a.Aic - b.Aic) <= TieTolerance;
    }

    /// <summary>
    /// Bayes factors of the first (best-ranked) model over each other one: from the log-evidences when every
    /// model has one, otherwise the BIC approximation ln B ≈ (BIC_other − BIC_best)/2.
    /// </summary>
    public static IReadOnlyList<BayesFactor> BayesFactors(IReadOnlyList<ModelFitSummary> ranked)
    {
        ArgumentNullException.ThrowIfNull(ranked);
        if (ranked.Count < 2) return [];
        bool evidence = ranked.All(m => m.LogEvidence is not null);
        var best = evidence ? ranked.OrderByDescending(m => m.LogEvidence!.Value).First() : ranked[0];
        var list = new List<BayesFactor>();
        foreach (var m in ranked)
        {
            if (ReferenceEquals(m, best)) continue;
            double lnB;
            double? err = null;
            if (evidence)
            {
                lnB = best.LogEvidence!.Value - m.LogEvidence!.Value;
                if (best.LogEvidenceError is { } e1 && m.LogEvidenceError is { } e2) err = Math.Sqrt(e1 * e1 + e2 * e2);
            }
            else lnB = (m.Bic - best.Bic) / 2;
            list.Add(new BayesFactor(best.Name, m.Name, lnB, err, !evidence, BayesFactor.Describe(lnB)));
        }
        return list;
    }
}

namespace SizeTest.Inference;

/// <summary>Ranks fitted models by information criteria and evidence.</summary>
public static class ModelComparison
{
    /// <summary>
    /// Fills ΔAIC, ΔBIC and Akaike weights w_i = exp(−ΔAIC_i/2) / Σ_j exp(−ΔAIC_j/2) (Akaike 1978;
    /// Burnham &amp; Anderson 2002, §2.9) and returns the models ordered by BIC (then AIC, then name).
    /// Models whose ln L̂ is not finite get no weight.
    /// </summary>
    public static IReadOnlyList<ModelFitSummary> Rank(IReadOnlyList<ModelFitSummary> models)
    {
        ArgumentNullException.ThrowIfNull(models);
        if (models.Count == 0) return [];
        var finite = models.Where(m => double.IsFinite(m.Aic)).ToArray();
        double minAic = finite.Length > 0 ? finite.Min(m => m.Aic) : double.NaN;
        double minBic = finite.Length > 0 ? finite.Min(m => m.Bic) : double.NaN;
        double norm = finite.Sum(m => Math.Exp(-(m.Aic - minAic) / 2));
        return models
            .Select(m => m with
            {
                DeltaAic = m.Aic - minAic,
                DeltaBic = m.Bic - minBic,
                AkaikeWeight = double.IsFinite(m.Aic) ? Math.Exp(-(m.Aic - minAic) / 2) / norm : 0,
            })
            .OrderBy(m => double.IsFinite(m.Bic) ? m.Bic : double.MaxValue).ThenBy(m => m.Aic).ThenBy(m => m.Name, StringComparer.Ordinal)
            .ToArray();
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

using System.Globalization;
using SizeTest.Cosmology;
using SizeTest.Inference;

namespace SizeTest.Inference.Comparison;

/// <summary>
/// The machine-readable answer of a study (the top-level <c>verdict</c> of results.json): the best model or null,
/// whether the data decide, the strength of evidence on the Kass &amp; Raftery (1995) scale and the reason in words.
/// </summary>
/// <param name="Best">Machine name of the preferred model, or null when no model can be named (ties, nothing to compare).</param>
/// <param name="Decided">True only when the best model beats the runner-up by ΔBIC ≥ 2 (2 ln B ≥ 2 with evidences),
/// both fits converged, no multimodality changes the ranking and some block of the likelihood can separate the models.</param>
/// <param name="Strength"><c>none</c>, <c>weak</c>, <c>positive</c>, <c>strong</c> or <c>very strong</c> (<see cref="EvidenceStrength"/>).</param>
/// <param name="Reason">One or two sentences naming the cause.</param>
public sealed record StudyVerdict(string? Best, bool Decided, string Strength, string Reason)
{
    /// <summary>Below this ΔBIC (≈ 2 ln B) the ranking is within noise: "not worth more than a bare mention" (Kass &amp; Raftery 1995).</summary>
    public const double DecisiveTwoLnB = 2.0;

    /// <summary>Two maximum log-likelihoods closer than this (absolute, plus 1e-9 relative) tie.</summary>
    public const double TieLogLikelihood = 1e-6;

    /// <summary>
    /// Decides from the ranked models of <paramref name="result"/>. Ranking: by evidence when every model has one,
    /// else by BIC (ΔBIC ≈ 2 ln B, Kass &amp; Raftery 1995 eq. 9). In order, the verdict is undecided when: fewer than
    /// two models have a finite likelihood; the surface-brightness block is the only one and cannot discriminate
    /// (<see cref="LikelihoodBlocks"/>); the best two tie; either of them did not converge; a mode of another model
    /// (<paramref name="modes"/>) would beat the reported best; or 2 ln B &lt; 2.
    /// </summary>
    /// <param name="result">The study.</param>
    /// <param name="modes">Per model, the ln L of every distinct maximum found (when a multimodality scan ran); optional.</param>
    public static StudyVerdict From(FitResult result, IReadOnlyDictionary<string, IReadOnlyList<double>>? modes = null)
    {
        ArgumentNullException.ThrowIfNull(result);
        var inv = CultureInfo.InvariantCulture;
        // The multimodality scan's maxima (ModelFitSummary.Modes) unless the caller passes its own.
        modes ??= result.Models.Where(m => m.Modes.Count > 1)
            .ToDictionary(m => m.Name, m => (IReadOnlyList<double>)m.Modes.Select(x => x.LogLikelihood).ToList(), StringComparer.Ordinal);
        var finite = result.Models.Where(m => double.IsFinite(m.LogLikelihood) && double.IsFinite(m.Bic)).ToList();
        bool byEvidence = finite.Count > 1 && finite.All(m => m.LogEvidence is { } z && double.IsFinite(z));
        var ranked = byEvidence ? finite.OrderByDescending(m => m.LogEvidence!.Value).ToList() : finite.OrderBy(m => m.Bic).ToList();
        string L(ModelFitSummary m) => WorldModelDisplayNames.For(m.Name);

        if (ranked.Count == 0)
            return new StudyVerdict(null, false, "none", "No model has a finite likelihood, so there is nothing to rank.");
        if (ranked.Count == 1)
            return new StudyVerdict(ranked[0].Name, false, "none", result.Models.Count == 1
                ? $"Only {L(ranked[0])} was fitted; a verdict needs at least two models to compare."
                : $"Only {L(ranked[0])} has a finite likelihood ({result.Models.Count - 1} of {result.Models.Count} models have none); a verdict needs at least two models to compare.");

        // A luminosity window recomputed with each world model's own D_L keeps different objects under each model: the likelihoods are
        // over different data, so no information criterion or Bayes factor can rank them.
        if (result.Settings.Survey is { AbsMagMin: not null } or { AbsMagMax: not null })
            return new StudyVerdict(null, false, "none",
                "The luminosity window is recomputed with each world model's own D_L, so each model is fitted to different objects (the notes give the counts); " +
                "their likelihoods cannot be compared and the data cannot rank the models this way. Fit the size–luminosity relation without a window, " +
                "or select the sample once in a reference cosmology, to compare them.");

        var best = ranked[0];
        var second = ranked[1];
        double twoLnB = byEvidence ? 2 * (best.LogEvidence!.Value - second.LogEvidence!.Value) : second.Bic - best.Bic;
        string measure = byEvidence ? "2 ln B" : "ΔBIC";
        string gap = $"{measure} = {twoLnB.ToString("0.0", inv)}";
        string? blocks = LikelihoodBlocks.Note(result);

        if (LikelihoodBlocks.NothingDiscriminates(result))
            return new StudyVerdict(null, false, "none", "Surface brightness cannot separate the models while sb_evolution is free (it constrains only n − b): every model fits equally well, so the data cannot decide.");

        double tie = TieLogLikelihood + 1e-9 * Math.Abs(best.LogLikelihood);
        bool sameK = best.K == second.K;
        if ((Math.Abs(best.LogLikelihood - second.LogLikelihood) <= tie && sameK) || Math.Abs(twoLnB) < 1e-9)
        {
            var tied = ranked.Where(m => Math.Abs(m.LogLikelihood - best.LogLikelihood) <= tie && m.K == best.K).Select(L).ToList();
            if (tied.Count < 2) tied = [L(best), L(second)];
            return new StudyVerdict(null, false, "none", $"The likelihoods of {Join(tied)} tie, so the data cannot rank them." + (blocks is null ? "" : " " + blocks));
        }

        string strength = EvidenceStrength.FromTwoLnB(twoLnB);
        var failed = new[] { best, second }.Where(m => !m.Converged).ToList();
        if (failed.Count > 0)
            return new StudyVerdict(best.Name, false, strength,
                $"The fit of {Join(failed.Select(L).ToList())} did not converge ({string.Join("; ", failed.Select(f => f.ExitReason.Text).Where(r => r.Length > 0).DefaultIfEmpty("no reason given"))}), so the ranking of {L(best)} over {L(second)} ({gap}) cannot be trusted.");

        if (modes.Count > 0)
        {
            // A mode of another model whose ln L (with that model's k) would give a lower BIC than the best's changes the ranking.
            foreach (var m in ranked.Skip(1))
                if (modes.TryGetValue(m.Name, out var lls) && lls.Any(ll => m.K * Math.Log(Math.Max(m.N, 1)) - 2 * ll < best.Bic))
                    return new StudyVerdict(best.Name, false, strength, $"{L(m)} has another maximum of the likelihood that would rank it above {L(best)}, so the ranking depends on which maximum is taken.");
            if (modes.TryGetValue(best.Name, out var own) && own.Any(ll => ll > best.LogLikelihood + tie))
                return new StudyVerdict(best.Name, false, strength, $"{L(best)} has a higher maximum of the likelihood than the one reported, so its fit is not the global maximum.");
        }

        if (twoLnB < DecisiveTwoLnB)
            return new StudyVerdict(best.Name, false, strength,
                $"{L(best)} and {L(second)} differ by {gap} < 2, which is within noise (not worth more than a bare mention on the Kass & Raftery 1995 scale)." + (blocks is null ? "" : " " + blocks));

        return new StudyVerdict(best.Name, true, strength,
            $"{L(best)} is preferred over the runner-up {L(second)} by {gap}, {EvidenceStrength.Words(strength)} evidence on the Kass & Raftery (1995) scale." + (blocks is null ? "" : " " + blocks));
    }

    private static string Join(IReadOnlyList<string> names) =>
        names.Count <= 1 ? string.Concat(names) : string.Join(", ", names.Take(names.Count - 1)) + " and " + names[^1];
}

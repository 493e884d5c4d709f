using System.Globalization;
using SizeTest.Cosmology;
using SizeTest.Inference;

namespace SizeTest.Inference.Comparison;

/// <summary>
/// The machine-readable answer of a study (the top-level <c>verdict</c> of results.json): the best model or null,
/// whether the data decide, the strength of evidence on the Kass &amp; Raftery (1995) scale and the reason in words.
/// </summary>
/// <param name="Best">Machine name of the model that ranks first, or null when no model can be named (ties, nothing to compare,
/// models that cannot be ranked).</param>
/// <param name="Decided">True only when the best model beats the runner-up by 2 ln B ≥ <see cref="DecisiveTwoLnB"/> (ΔBIC, or
/// the evidences less twice their nested-sampling error), both fits converged, no multimodality changes the ranking and some
/// block of the likelihood can separate the models.</param>
/// <param name="Strength"><c>none</c>, <c>weak</c>, <c>positive</c>, <c>strong</c> or <c>very strong</c> (<see cref="EvidenceStrength"/>).</param>
/// <param name="Reason">One or two sentences naming the cause.</param>
public sealed record StudyVerdict(string? Best, bool Decided, string Strength, string Reason)
{
    /// <summary>
    /// False when the models' likelihoods cannot be ranked against each other at all (each model fitted to different objects
    /// by a luminosity window in its own D_L; binned evolution, whose ranking follows the bin count): the tables then say
    /// "not ranked" instead of ΔBIC words.
    /// </summary>
    public bool Comparable { get; init; } = true;

    /// <summary>
    /// The gap at which the data decide: 2 ln B (≈ ΔBIC, Kass &amp; Raftery 1995 eq. 9) ≥ 6, the start of "strong" evidence on their
    /// §3.2 scale. "Positive" evidence (2–6) names the leader but does not decide: on 200 mock catalogues per design fitted with free
    /// size evolution (docs/verdict-threshold.md), a wrong model ranked first by ΔBIC ≥ 2 in 6.5–9.5% of flat-ΛCDM mocks and 2.5–5% of
    /// tired-light mocks (N = 300–1000), and by ΔBIC ≥ 6 in at most 0.5%, so "positive" is not rare enough under a wrong model to be
    /// called a decision.
    /// </summary>
    public const double DecisiveTwoLnB = 6.0;

    /// <summary>Below this 2 ln B the ranking is within noise: "not worth more than a bare mention" (Kass &amp; Raftery 1995, §3.2).</summary>
    public const double NoiseTwoLnB = 2.0;

    /// <summary>Two maximum log-likelihoods closer than this (absolute, plus 1e-9 relative) tie.</summary>
    public const double TieLogLikelihood = 1e-6;

    /// <summary>
    /// Decides from the ranked models of <paramref name="result"/>. Ranking: by evidence when every model has one,
    /// else by BIC (ΔBIC ≈ 2 ln B, Kass &amp; Raftery 1995 eq. 9). In order, the verdict is undecided when: fewer than
    /// two models have a finite likelihood; the models cannot be ranked at all (<see cref="NotComparable"/>); the
    /// surface-brightness block is the only one and cannot discriminate (<see cref="LikelihoodBlocks"/>); the best two tie
    /// (<see cref="ModelComparison.Ties"/>, the table's tie); either of them did not converge; a mode of another model
    /// (<paramref name="modes"/>) would beat the reported best; 2 ln B &lt; <see cref="NoiseTwoLnB"/> (within noise, no leader
    /// claimed beyond "ranks first"); or 2 ln B &lt; <see cref="DecisiveTwoLnB"/> (positive evidence: the leader is named,
    /// the data do not decide). With nested-sampling evidences the gap used is 2 ln B less twice its 1σ error.
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

        if (NotComparable(result.Settings) is { } notComparable) return notComparable;

        var best = ranked[0];
        var second = ranked[1];
        double twoLnB = byEvidence ? 2 * (best.LogEvidence!.Value - second.LogEvidence!.Value) : second.Bic - best.Bic;
        // Nested sampling's evidences carry a 1σ error each; the gap must clear a threshold by twice the error of 2 ln B.
        double twoLnBError = byEvidence && best.LogEvidenceError is { } e1 && second.LogEvidenceError is { } e2 ? 2 * Math.Sqrt(e1 * e1 + e2 * e2) : 0;
        double judged = twoLnB - 2 * twoLnBError;
        string measure = byEvidence ? "2 ln B" : "ΔBIC";
        string gap = $"{measure} = {twoLnB.ToString("0.0", inv)}" + (twoLnBError > 0 ? $" ± {twoLnBError.ToString("0.0", inv)} (nested-sampling error)" : "");
        string? blocks = LikelihoodBlocks.Note(result);
        string Blocks() => blocks is null ? "" : " " + blocks;

        if (LikelihoodBlocks.NothingDiscriminates(result))
            return new StudyVerdict(null, false, "none", "Surface brightness cannot separate the models while sb_evolution is free (it constrains only n − b): every model fits equally well, so the data cannot decide.");

        double tie = TieLogLikelihood + 1e-9 * Math.Abs(best.LogLikelihood);
        bool Tie(ModelFitSummary m) => byEvidence ? Math.Abs(m.LogLikelihood - best.LogLikelihood) <= tie && m.K == best.K : ModelComparison.Ties(best, m);
        if (Tie(second) || Math.Abs(twoLnB) < 1e-9)
        {
            var tied = ranked.Where(Tie).Select(L).ToList();
            if (tied.Count < 2) tied = [L(best), L(second)];
            return new StudyVerdict(null, false, "none", $"The likelihoods of {Join(tied)} tie, so the data cannot rank them." + Blocks());
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

        string errorWords = twoLnBError > 0 ? " once twice its error is taken off" : "";
        if (judged < NoiseTwoLnB)
            return new StudyVerdict(best.Name, false, strength,
                $"{L(best)} and {L(second)} differ by {gap}, below 2{errorWords}, which is within noise (not worth more than a bare mention on the Kass & Raftery 1995 scale): the data do not decide." + Blocks());

        if (judged < DecisiveTwoLnB)
            return new StudyVerdict(best.Name, false, strength,
                $"{L(best)} ranks first over {L(second)} by {gap}, {EvidenceStrength.Words(strength)} evidence on the Kass & Raftery (1995) scale, " +
                $"but below the {DecisiveTwoLnB.ToString("0", inv)} (strong evidence){errorWords} SizeTest requires to call a decision: a wrong model reaches positive evidence too often on mock catalogues, so the data do not decide." + Blocks());

        return new StudyVerdict(best.Name, true, strength,
            $"{L(best)} is preferred over the runner-up {L(second)} by {gap}, {EvidenceStrength.Words(strength)} evidence on the Kass & Raftery (1995) scale." + Blocks());
    }

    /// <summary>
    /// The verdict when the settings make the models' likelihoods impossible to rank against each other, else null: a luminosity
    /// window recomputed with each model's own D_L (each model is fitted to different objects), or binned evolution (each model's
    /// ln L̂ measures how well K steps follow the smooth evolution it needs, so the ranking changes with K). <see cref="Comparable"/>
    /// is false, no model is named.
    /// </summary>
    public static StudyVerdict? NotComparable(FitSettings settings)
    {
        ArgumentNullException.ThrowIfNull(settings);
        if (settings.Survey is { AbsMagMin: not null } or { AbsMagMax: not null })
            return new StudyVerdict(null, false, "none",
                "The luminosity window is recomputed with each world model's own D_L, so each model is fitted to different objects (the notes give the counts); " +
                "their likelihoods cannot be compared and the data cannot rank the models this way. Fit the size–luminosity relation without a window, " +
                "or select the sample once in a reference cosmology, to compare them.") { Comparable = false };
        if (settings.Survey is { EvolutionBinEdges: { Count: > 1 } edges })
            return new StudyVerdict(null, false, "none",
                $"With binned evolution ({edges.Count - 1} redshift bins) each model's likelihood measures how well steps in R0 (and μ0) follow the smooth evolution that model needs, " +
                "so the ranking changes with the number of bins and says nothing about the world model; the models are not ranked. " +
                "Read the shape each model requires from the binned-evolution figure, and rank the models with a power-law (or other smooth) evolution.") { Comparable = false };
        return null;
    }

    private static string Join(IReadOnlyList<string> names) =>
        names.Count <= 1 ? string.Concat(names) : string.Join(", ", names.Take(names.Count - 1)) + " and " + names[^1];
}

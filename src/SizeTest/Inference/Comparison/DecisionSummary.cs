using SizeTest.Cosmology;
using SizeTest.Inference;

namespace SizeTest.Inference.Comparison;

/// <summary>
/// The short answers a reader wants before any table: the verdict in one line, whether the data can decide (a block
/// that does not discriminate, a ranking within noise, a fit that did not converge) and which model needs evolution
/// that is implausible. Shared by the CLI and the report so both say the same thing.
/// </summary>
public static class DecisionSummary
{
    /// <summary>
    /// "ΛCDM is preferred; the data decide (strong evidence).", "ΛCDM ranks first (positive evidence), but the data do not decide.",
    /// "ΛCDM ranks first, but the data do not decide." or "The models are not ranked …" / "The data do not decide between the models."
    /// </summary>
    public static string Headline(StudyVerdict v)
    {
        ArgumentNullException.ThrowIfNull(v);
        if (!v.Comparable) return "The models are not ranked: their likelihoods cannot be compared under these settings (see why below).";
        string best = v.Best is null ? "no model" : WorldModelDisplayNames.For(v.Best);
        if (v.Decided) return $"{best} is preferred; the data decide ({EvidenceStrength.Words(v.Strength)} evidence).";
        if (v.Best is null) return "The data do not decide between the models.";
        return v.Strength is "positive" or "strong" or "very strong"
            ? $"{best} ranks first ({v.Strength} evidence), but the data do not decide."
            : $"{best} ranks first, but the data do not decide.";
    }

    /// <summary>
    /// The words of the comparison tables' "evidence against" column for a model that is not first: "not ranked (see the verdict)"
    /// when the verdict says the models cannot be compared, else the Kass–Raftery words for its ΔBIC (<see cref="EvidenceStrength.AgainstBest"/>).
    /// </summary>
    public static string AgainstBest(StudyVerdict v, double deltaBic)
    {
        ArgumentNullException.ThrowIfNull(v);
        return v.Comparable ? EvidenceStrength.AgainstBest(deltaBic) : NotRankedWords;
    }

    /// <summary>What a comparison table shows in place of ranking words when the models cannot be ranked.</summary>
    public const string NotRankedWords = "not ranked (see the verdict)";

    /// <summary>The "can the data decide?" lines: the verdict's reason, the block note and convergence.</summary>
    public static IReadOnlyList<string> CanTheDataDecide(FitResult result)
    {
        ArgumentNullException.ThrowIfNull(result);
        var v = result.Verdict;
        var lines = new List<string> { v.Reason };
        if (LikelihoodBlocks.Note(result) is { } b && !v.Reason.Contains(b, StringComparison.Ordinal) && !LikelihoodBlocks.NothingDiscriminates(result)) lines.Add(b);
        var failed = result.Models.Where(m => !m.Converged).Select(m => WorldModelDisplayNames.For(m.Name)).ToList();
        if (failed.Count > 0 && !v.Reason.Contains("did not converge", StringComparison.Ordinal))
            lines.Add($"Not converged: {string.Join(", ", failed)}; their numbers are not reliable.");
        return lines;
    }

    /// <summary>
    /// One call-out per model whose required evolution is not plausible, naming it ("static linear needs evolution
    /// that is not plausible: a = … has the wrong sign (…) and b = … ."); models with a wrong sign come first.
    /// </summary>
    public static IReadOnlyList<string> Implausible(IReadOnlyList<EvolutionTestRow> rows)
    {
        ArgumentNullException.ThrowIfNull(rows);
        return rows.GroupBy(r => r.Model)
            .Select(g => (Label: g.First().ModelLabel, Worst: g.Max(r => r.Plausibility == Plausibility.WrongSign ? 3 : r.Plausibility == Plausibility.FarOutside ? 2 : r.Plausibility == Plausibility.Outside ? 1 : 0),
                Parts: g.Select(EvolutionTestTable.CallOutFragment).Where(f => f is not null).ToList()))
            .Where(x => x.Parts.Count > 0)
            .OrderByDescending(x => x.Worst)
            .Select(x => $"{x.Label}'s required evolution is not plausible: {string.Join("; and ", x.Parts)}.")
            .ToList();
    }
}

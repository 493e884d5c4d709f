using System.Globalization;
using SizeTest.Inference.Comparison;
using SizeTest.Reporting.Data;

namespace SizeTest.Reporting;

/// <summary>
/// The sentences a report states, derived from the verdict, the "can the data decide" lines and the one table of
/// evolution tests (no refitting). Every "needs evolution" sentence is <see cref="EvolutionTestTable.Statement"/>
/// of one row, so the report, the CLI and results.json word each test the same way and cannot disagree.
/// </summary>
public static class ReportConclusions
{
    /// <summary>At most this many sentences open the report under the summary table.</summary>
    public const int MaxSummarySentences = 6;

    /// <summary>The caution printed with every ranking.</summary>
    public const string Caution =
        "Information criteria and Bayes factors rank the models given the assumptions listed here — the world-model family and its priors, " +
        "the form of size and luminosity evolution, the selection model and the photometric corrections. They do not say which model is true, " +
        "and a model that needs a large evolution term to fit may rank high for that reason alone.";

    /// <summary>
    /// The handful of sentences under the summary table: the verdict, whether the data can decide, which models need
    /// implausible evolution (by name), and a note when the catalogue is synthetic.
    /// </summary>
    public static IReadOnlyList<string> Derive(ReportData data)
    {
        ArgumentNullException.ThrowIfNull(data);
        var list = new List<string>();
        var ic = CultureInfo.InvariantCulture;
        if (data.Models.Count == 0)
        {
            list.Add("No model was fitted.");
        }
        else if (data.Verdict is { } v)
        {
            list.Add(DecisionSummary.Headline(v));
            list.AddRange(data.DecisionLines.Count > 0 ? data.DecisionLines : [v.Reason]);
        }
        else
        {
            var models = data.Models.OrderBy(m => m.Fit.Bic).ThenBy(m => m.Fit.Name, StringComparer.Ordinal).ToList();
            list.Add(models.Count == 1
                ? $"Only {models[0].Label} was fitted; there is nothing to compare it with."
                : $"By BIC the preferred model is {models[0].Label}; the runner-up {models[1].Label} has ΔBIC = {models[1].Fit.DeltaBic.ToString("0.0", ic)} ({EvidenceStrength.Words(EvidenceStrength.FromTwoLnB(models[1].Fit.DeltaBic))} on the Kass & Raftery 1995 scale).");
            var failed = data.Models.Where(m => !m.Fit.Converged).ToList();
            if (failed.Count > 0)
                list.Add($"Not converged: {string.Join(", ", failed.Select(m => m.Label))}; their criteria are not reliable.");
        }
        var callOuts = DecisionSummary.Implausible(data.EvolutionTests);
        int room = Math.Max(0, MaxSummarySentences - list.Count - (data.Job.Synthetic ? 1 : 0));
        list.AddRange(callOuts.Take(room));
        if (callOuts.Count > room) list[^1] += $" ({callOuts.Count - room} more in the evolution tests.)";
        if (data.Power is { Statement.Length: > 0 } ps && list.Count < MaxSummarySentences)
            list.Add(ps.Statement);
        else if (data.Power is { } p && p.Target is { } t && list.Count < MaxSummarySentences)
            list.Add($"See the power curve: below power {t.ToString("0.##", ic)} the sample size cannot be relied on to separate the models.");
        if (data.Job.Synthetic)
            list.Add("The catalogue is synthetic: these conclusions describe a demonstration or mock, not the sky.");
        return list;
    }

    /// <summary>The evolution statements, one per row of the evolution tests, in table order.</summary>
    public static IReadOnlyList<string> Statements(ReportData data)
    {
        ArgumentNullException.ThrowIfNull(data);
        return Rows(data).Select(EvolutionTestTable.Statement).ToList();
    }

    /// <summary>
    /// The evolution-test rows: those the study computed, or, for report data made without them, one untested row per
    /// required evolution (so the report states the estimates and claims nothing about zero).
    /// </summary>
    public static IReadOnlyList<EvolutionTestRow> Rows(ReportData data)
    {
        ArgumentNullException.ThrowIfNull(data);
        if (data.EvolutionTests.Count > 0) return data.EvolutionTests;
        return data.Models.SelectMany(m => m.RequiredEvolution.Select(e =>
            new EvolutionTestRow(m.Fit.Name, e.Name, e.Value, e.Lo, e.Hi, null, EvolutionNeed.NotTested, Plausibility.NotJudged, null))).ToList();
    }
}

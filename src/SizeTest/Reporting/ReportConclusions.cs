using System.Globalization;
using SizeTest.Reporting.Data;
using SizeTest.Reporting.Figures;

namespace SizeTest.Reporting;

/// <summary>
/// The conclusions a report states, derived in words from the criteria it was given (no
/// refitting), always shown beside the assumptions they rest on.
/// </summary>
public static class ReportConclusions
{
    /// <summary>The caution printed with every ranking.</summary>
    public const string Caution =
        "Information criteria and Bayes factors rank the models given the assumptions listed here — the world-model family and its priors, " +
        "the form of size and luminosity evolution, the selection model and the photometric corrections. They do not say which model is true, " +
        "and a model that needs a large evolution term to fit may rank high for that reason alone.";

    /// <summary>Conclusions in words, best-ranked model first, then evolution, convergence and any extra conclusions.</summary>
    public static IReadOnlyList<string> Derive(ReportData data)
    {
        var list = new List<string>();
        var ic = CultureInfo.InvariantCulture;
        if (data.Job.Synthetic)
            list.Add("The catalogue is synthetic: these conclusions describe a demonstration or mock, not the sky.");
        var models = data.Models.OrderBy(m => m.Fit.Bic).ThenBy(m => m.Fit.Name, StringComparer.Ordinal).ToList();
        if (models.Count == 0)
        {
            list.Add("No model was fitted.");
        }
        else
        {
            var best = models[0];
            list.Add($"By BIC the preferred model is {best.Label} (lowest BIC, {best.Fit.Bic.ToString("0.0", ic)}).");
            foreach (var m in models.Skip(1))
                list.Add($"Against {m.Label}: ΔBIC = {m.Fit.DeltaBic.ToString("0.0", ic)}, evidence for {best.Label} that is {ReportNumbers.EvidenceWords(m.Fit.DeltaBic)} on the Kass & Raftery (1995) scale; ΔAIC = {m.Fit.DeltaAic.ToString("0.0", ic)}.");
            var bestAic = data.Models.OrderBy(m => m.Fit.Aic).First();
            if (!ReferenceEquals(bestAic, best))
                list.Add($"AIC prefers {bestAic.Label} instead: the two criteria weigh the extra parameters differently, so the ranking is not robust.");
            foreach (var m in data.Models)
                foreach (var e in m.RequiredEvolution)
                {
                    bool excludesZero = e.Lo > 0 || e.Hi < 0;
                    list.Add($"{m.Label} needs {e.Description} = {e.Value.ToString("0.00", ic)} (68%: {e.Lo.ToString("0.00", ic)} to {e.Hi.ToString("0.00", ic)})" +
                             (excludesZero ? ", which excludes no evolution." : ", consistent with no evolution."));
                }
            var failed = data.Models.Where(m => !m.Fit.Converged).ToList();
            if (failed.Count > 0)
                list.Add($"Not converged: {string.Join(", ", failed.Select(m => $"{m.Label} ({m.Fit.ExitReason})"))}; their criteria are not reliable.");
        }
        if (data.Power is { } p && p.Target is { } t)
            list.Add($"See the power curve: below power {t.ToString("0.##", ic)} the sample size cannot be relied on to separate the models.");
        list.AddRange(data.ExtraConclusions);
        return list;
    }
}

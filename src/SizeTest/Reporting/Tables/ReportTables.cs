using SizeTest.Inference;
using System.Globalization;
using SizeTest.Foundation.Text;
using SizeTest.Inference.Comparison;
using SizeTest.Reporting.Data;
using SizeTest.Reporting.Figures;

namespace SizeTest.Reporting.Tables;

/// <summary>
/// The tables of a report, built from <see cref="ReportData"/>. Cells people read are rounded to their uncertainty
/// by the PDG rule (<see cref="PdgRounding"/>) with the trade's symbols in the headers (ΔAIC, ln L, 68% interval);
/// the CSV versions keep full precision and machine column names (<see cref="ReportTable.MachineRows"/>).
/// </summary>
public static class ReportTables
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <summary>
    /// The summary table the report opens with: per model ΔBIC, the evidence against it in words, the size and SB
    /// evolution it needs (± the 68% half-width), whether that evolution is plausible, and convergence.
    /// </summary>
    public static ReportTable Summary(ReportData data)
    {
        var rows = new List<IReadOnlyList<string>>();
        var raw = new List<IReadOnlyList<string>>();
        var ordered = data.Models.OrderBy(m => m.Fit.DeltaBic).ToList();
        foreach (var m in ordered)
        {
            string Need(string name)
            {
                var row = data.EvolutionTests.FirstOrDefault(r => r.Model == m.Fit.Name && r.Parameter == name);
                if (row is not null) return row.ValueText + (row.Need == EvolutionNeed.NotNeeded ? " (not needed)" : "");
                // Populations (--group): each group's own exponent, "a[early] = …; a[late] = …".
                var perGroup = data.EvolutionTests.Where(r => r.Model == m.Fit.Name && EvolutionTestTable.GroupOf(r.Parameter) is not null && EvolutionTestTable.BaseName(r.Parameter) == name).ToList();
                if (perGroup.Count > 0)
                    return string.Join("; ", perGroup.Select(r => $"{r.Symbol} = {r.ValueText}" + (r.Need == EvolutionNeed.NotNeeded ? " (not needed)" : "")));
                var p = m.Fit.Parameters.FirstOrDefault(q => q.Name == name);
                return p is null ? "—" : p.Fixed ? $"{PdgRounding.Plain(p.Value)} (fixed)" : PdgRounding.ValueWithInterval(p.Value, p.Lo, p.Hi);
            }
            var judged = data.EvolutionTests.Where(r => r.Model == m.Fit.Name && r.Plausibility != Plausibility.NotJudged).ToList();
            string plaus = judged.Count == 0 ? "not judged"
                : judged.All(r => r.Plausibility == Plausibility.Plausible) ? "plausible"
                : string.Join("; ", judged.Where(r => r.Plausibility != Plausibility.Plausible).Select(r => $"{r.Symbol}: {EvolutionTestTable.PlausibilityWords(r.Plausibility)}"));
            bool best = ReferenceEquals(m, ordered[0]);
            bool ranked = data.Verdict is not { Comparable: false };
            string words = !ranked ? DecisionSummary.NotRankedWords : m.Fit.Tied && m.Fit.Rank == 1 ? "tied for first" : best ? "best by BIC" : EvidenceStrength.AgainstBest(m.Fit.DeltaBic);
            string machineWords = !ranked ? "not_ranked" : m.Fit.Tied && m.Fit.Rank == 1 ? "tied" : best ? "best" : EvidenceStrength.FromTwoLnB(m.Fit.DeltaBic);
            rows.Add([m.Label, DeltaText(m.Fit.DeltaBic), words, Need(NuisanceParameters.Names.SizeEvolution), Need(NuisanceParameters.Names.SbEvolution), plaus, m.Fit.Converged ? "yes" : "no"]);
            raw.Add([m.Fit.Name, R(m.Fit.DeltaBic), machineWords, Raw(m, NuisanceParameters.Names.SizeEvolution), Raw(m, NuisanceParameters.Names.SbEvolution), plaus, m.Fit.Converged ? "true" : "false"]);
        }
        return new ReportTable("summary", "Summary", ["model", "ΔBIC", "evidence against the model", "size evolution a", "SB evolution b", "evolution plausible?", "converged"], rows)
        {
            Caption = "ΔBIC ≈ 2 ln B against the best model, in the words of Kass & Raftery (1995): below 2 not worth more than a bare mention, 2–6 positive, 6–10 strong, above 10 very strong; " +
                      $"the verdict calls a decision only from {StudyVerdict.DecisiveTwoLnB.ToString("0", Inv)} (strong) on. " +
                      "a in R ∝ (1+z)^a and b in Δμ = −2.5 b log10(1+z), each with its 68% interval, rounded by the PDG rule; \"not needed\" when the likelihood-ratio test does not reject zero at the 95% level. " +
                      "Plausibility compares the 68% interval with published expectations (see the evolution tests below).",
            MachineColumns = ["model", "delta_bic", "strength", NuisanceParameters.Names.SizeEvolution, NuisanceParameters.Names.SbEvolution, "plausibility", "converged"],
            MachineRows = raw,
            EmptyText = "No model was fitted.",
        };
    }

    /// <summary>The one table of evolution tests the conclusions are generated from.</summary>
    public static ReportTable EvolutionTests(ReportData data)
    {
        var tests = ReportConclusions.Rows(data);
        var rows = tests.Select(r => (IReadOnlyList<string>)
        [
            r.ModelLabel, r.Symbol, r.ValueText,
            r.PValue is { } p ? LikelihoodRatioTestPValue(p) : "not run",
            r.Need switch { EvolutionNeed.Needed => "needed", EvolutionNeed.NotNeeded => "not needed", _ => "not tested" },
            r.Expectation is { } e ? $"[{PdgRounding.Plain(e.Lo)}, {PdgRounding.Plain(e.Hi)}]" : "—",
            EvolutionTestTable.PlausibilityWords(r.Plausibility),
        ]).ToList();
        var raw = tests.Select(r => (IReadOnlyList<string>)
        [
            r.Model, r.Parameter, R(r.Value), R(r.Lo), R(r.Hi), r.PValue is { } p ? R(p) : "",
            r.Need.ToString(), r.Expectation is { } e ? R(e.Lo) : "", r.Expectation is { } e2 ? R(e2.Hi) : "", r.Plausibility.ToString(),
        ]).ToList();
        var sources = tests.Select(r => r.Expectation).Where(e => e is not null).Select(e => $"{EvolutionTestTable.What(e!.Parameter)}: {e.ShortSource}").Distinct().ToList();
        return new ReportTable("evolution-tests", "Evolution tests", ["model", "term", "estimate (68% interval)", "LRT p (zero)", "at 95% level", "expected", "plausibility"], rows)
        {
            Caption = "Every statement about needed evolution comes from this table. Zero evolution is tested by one test only: the likelihood-ratio test of the model against the same model with the term fixed at 0 (Wilks 1938), " +
                      "rejected when p < 0.05. The 68% interval is an estimate and is not used to claim an exclusion. Expected ranges" +
                      (sources.Count > 0 ? " — " + string.Join("; ", sources) : "") + ".",
            MachineColumns = ["model", "parameter", "value", "lo_68", "hi_68", "lrt_p_value", "need", "expected_lo", "expected_hi", "plausibility"],
            MachineRows = raw,
            EmptyText = FitForm.Bins(data) is > 0 and var bins
                ? $"With binned evolution ({bins} redshift bins) no model has an evolution exponent to test against zero: the size each bin requires is measured bin by bin (the binned-evolution figure), and each model's power-law counterpart is stated in the notes."
                : "No model had a free evolution term, so no evolution test was run.",
        };
    }

    // "p = 0.057" → "0.057"; "p < 1e-300" keeps its "<" (a p-value that underflows is a bound, not a value).
    private static string LikelihoodRatioTestPValue(double p)
    {
        string text = Inference.Comparison.LikelihoodRatioTest.FormatPValue(p);
        text = text.StartsWith("p = ", StringComparison.Ordinal) ? text[4..] : text[2..];
        return text.Replace("-", PdgRounding.Minus, StringComparison.Ordinal);
    }

    private static string Raw(ModelReport m, string name) => m.Fit.Parameters.FirstOrDefault(p => p.Name == name) is { } p ? R(p.Value) : "";

    /// <summary>Best-fit parameters of every model with 68% intervals.</summary>
    public static ReportTable Parameters(ReportData data)
    {
        var rows = new List<IReadOnlyList<string>>();
        var raw = new List<IReadOnlyList<string>>();
        foreach (var m in data.Models)
            foreach (var p0 in m.Fit.Parameters)
            {
                // Compact radio sources: the size scale r0_kpc is ℓ_m, shown in pc by ParameterDisplay, the conversion the CLI uses too (the CSV keeps r0_kpc in kpc as results.json).
                var shown = ParameterDisplay.Shown(p0, data.Data.CompactRadioSources);
                string status = shown.Fixed ? "fixed" : shown.AtBound is { } b ? $"free, at its {b} bound" : "free";
                rows.Add([m.Label, shown.Name, shown.Fixed ? PdgRounding.Plain(shown.Value) : PdgRounding.ValueWithInterval(shown.Value, shown.Lo, shown.Hi),
                    shown.Fixed ? "" : PdgRounding.IntervalBounds(shown.Value, shown.Lo, shown.Hi),
                    shown.Fixed ? "" : Inference.IntervalMethods.Words(shown.IntervalMethod), status, shown.Unit]);
                var p = p0;
                raw.Add([m.Fit.Name, p.Name, R(p.Value), p.Fixed ? "" : R(p.Lo), p.Fixed ? "" : R(p.Hi), p.Fixed ? "" : p.IntervalMethod,
                    p.Fixed ? "fixed" : "free", p.AtBound ?? "", p.Unit]);
            }
        return new ReportTable("parameters", "Best-fit parameters",
            ["model", "parameter", "value", "68% interval", "interval from", "status", "unit"], rows)
        {
            Caption = "Best estimate with its 68% interval, rounded by the PDG rule (two significant digits of the error, one when its leading digits are 355–949). "
                + "\"interval from\" says how each interval was obtained: the Hessian (±1σ) where the profile likelihood is close to quadratic; "
                + "the profile likelihood (Δ ln L = ½, asymmetric) where it is not, where the likelihood has several maxima or where the parameter sits at a bound "
                + "(the interval is then one-sided); posterior percentiles (16th–84th) when sampled; bootstrap percentiles. Fixed parameters have no interval. The CSV keeps full precision.",
            MachineColumns = ["model", "parameter", "value", "lo_68", "hi_68", "interval_method", "status", "at_bound", "unit"],
            MachineRows = raw,
        };
    }

    /// <summary>Information criteria and weights of every model.</summary>
    public static ReportTable Comparison(ReportData data)
    {
        var bicW = ReportNumbers.BicWeights(data.Models);
        var rows = data.Models.Select((m, i) => (IReadOnlyList<string>)
        [
            m.Label, m.Fit.K.ToString(Inv), m.Fit.N.ToString(Inv),
            F2(m.Fit.LogLikelihood), F2(m.Fit.Aic), F2(m.Fit.Aicc), F2(m.Fit.Bic), DeltaText(m.Fit.DeltaAic), DeltaText(m.Fit.DeltaBic),
            W(m.Fit.AkaikeWeight), W(bicW[i]), m.Fit.LogEvidence is { } e ? (m.Fit.LogEvidenceError is { } ee ? PdgRounding.ValueWithError(e, ee) : F2(e)) : "", m.Fit.Converged ? "yes" : "no",
        ]).ToList();
        var raw = data.Models.Select((m, i) => (IReadOnlyList<string>)
        [
            m.Fit.Name, m.Fit.K.ToString(Inv), m.Fit.N.ToString(Inv), R(m.Fit.LogLikelihood), R(m.Fit.Aic), R(m.Fit.Aicc), R(m.Fit.Bic),
            R(m.Fit.DeltaAic), R(m.Fit.DeltaBic), R(m.Fit.AkaikeWeight), R(bicW[i]), m.Fit.LogEvidence is { } e ? R(e) : "", m.Fit.Converged ? "true" : "false",
        ]).ToList();
        return new ReportTable("comparison", "Model comparison",
            ["model", "k", "n", "ln L", "AIC", "AICc", "BIC", "ΔAIC", "ΔBIC", "w(AIC)", "w(BIC)", "ln Z", "converged"], rows)
        {
            Caption = "k free parameters, n objects, maximum log-likelihood ln L; AIC = 2k − 2 ln L (Akaike 1974), AICc adds 2k(k+1)/(n−k−1) (Hurvich & Tsai 1989), BIC = k ln n − 2 ln L (Schwarz 1978); ln Z the log-evidence when computed. " +
                      "Weights are exp(−Δ/2) normalised over the models. Criteria to 0.01, differences to 0.1 (the Kass & Raftery scale needs no more). The ranking holds only under the stated assumptions.",
            MachineColumns = ["model", "k", "n", "ln_L", "AIC", "AICc", "BIC", "delta_AIC", "delta_BIC", "akaike_weight", "bic_weight", "ln_evidence", "converged"],
            MachineRows = raw,
        };
    }

    /// <summary>Rows rejected per reason.</summary>
    public static ReportTable Rejects(ReportData data) => new("rejects", "Rejected rows by reason", ["reason", "rows"],
        data.Data.RejectReasons.Select(r => (IReadOnlyList<string>)[r.Reason, r.Count.ToString(Inv)]).ToList())
    {
        Caption = $"{data.Data.RowsRead} rows read = {data.Data.Accepted} accepted + {data.Data.Rejected} rejected.",
        EmptyText = "No row was rejected.",
    };

    /// <summary>All tables in report order.</summary>
    public static IReadOnlyList<ReportTable> All(ReportData data) => [Summary(data), EvolutionTests(data), Parameters(data), Comparison(data), .. ResamplingTables.All(data), Rejects(data)];

    /// <summary>Full precision (round-trip), invariant culture, ASCII minus: for CSV.</summary>
    public static string R(double v) => double.IsFinite(v) ? v.ToString("R", Inv) : (double.IsNaN(v) ? "NaN" : (v > 0 ? "Inf" : "-Inf"));

    /// <summary>Six significant digits, invariant culture, ASCII minus (kept for callers that format plain numbers).</summary>
    public static string Num(double v) => double.IsFinite(v) ? v.ToString("G6", Inv) : (double.IsNaN(v) ? "NaN" : (v > 0 ? "Inf" : "-Inf"));

    private static string F2(double v) => double.IsFinite(v) ? v.ToString("0.00", Inv).Replace("-", PdgRounding.Minus, StringComparison.Ordinal) : "—";

    private static string W(double v) => double.IsFinite(v) ? (v < 0.001 && v > 0 ? "< 0.001" : v.ToString("0.000", Inv)) : "—";

    private static string DeltaText(double v) => double.IsFinite(v) ? v.ToString("0.0", Inv).Replace("-", PdgRounding.Minus, StringComparison.Ordinal) : "—";
}

using System.Globalization;
using System.Text;
using SizeTest.Foundation.Text;
using SizeTest.Inference;
using SizeTest.Inference.Comparison;

namespace SizeTest.Cli;

/// <summary>Text renderings of a <see cref="FitResult"/>: the ranked table for people and results.csv.</summary>
internal static class FitTables
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    private static string R(double v) => double.IsFinite(v) ? v.ToString("R", Inv) : "";

    /// <summary>results.csv: one row per (model, parameter), models in rank order (the one writer, shared with <c>run</c>).</summary>
    public static string Csv(FitResult r) => SizeTest.Studies.StudyResultsCsv.Write(r);

    /// <summary>A profile curve as CSV.</summary>
    public static string ProfileCsv(ProfileLikelihoodResult p) => SizeTest.Studies.StudyOutputFiles.ProfileCsv(p);

    /// <summary>Nested-sampling weighted samples as CSV: the free parameters, log_likelihood, log_weight.</summary>
    public static string SamplesCsv(PosteriorDraws s) => SizeTest.Studies.StudyOutputFiles.SamplesCsv(s);

    // The estimate with its interval: ± form, or at a bound the value and the one-sided interval (never a ± interval).
    private static string Estimate(ParameterEstimate p) => p.AtBound is null
        ? PdgRounding.ValueWithInterval(p.Value, p.Lo, p.Hi)
        : $"{PdgRounding.Plain(p.Value)} [{PdgRounding.IntervalBounds(p.Value, p.Lo, p.Hi)}]";

    // How an interval was obtained, when it is not the Hessian's.
    private static string Marker(ParameterEstimate p) =>
        (p.Regions.Count > 1 ? " = " + string.Join(" ∪ ", p.Regions.Select(q => string.Create(Inv, $"[{q.Lo:0.####}, {q.Hi:0.####}]"))) : "")
        + (p.IntervalMethod is IntervalMethods.Hessian or IntervalMethods.Fixed ? "" : $" ({p.IntervalMethod})")
        + (p.AtBound is { } b ? $" (at {b} bound, one-sided)" : "");

    // The evolution column: the one exponent; per population "a[early] … ; a[late] …" (--group); with binned evolution the exponent
    // is replaced by the bins ("binned: K bins of r0_kpc (see the figure)"), never a blank.
    private static string EvolutionCell(ModelFitSummary m, string evo, string sym, FitSettings settings)
    {
        static string One(ParameterEstimate e) => e.Fixed ? $"{PdgRounding.Plain(e.Value)} (fixed)" : Estimate(e) + Marker(e);
        if (m.Parameters.FirstOrDefault(p => p.Name == evo) is { } e) return One(e);
        var perGroup = m.Parameters.Where(p => EvolutionTestTable.BaseName(p.Name) == evo && EvolutionTestTable.GroupOf(p.Name) is not null).ToList();
        if (perGroup.Count > 0) return string.Join("; ", perGroup.Select(p => $"{sym}[{EvolutionTestTable.GroupOf(p.Name)}] {One(p)}"));
        if (settings.Survey?.EvolutionBinEdges is { Count: > 1 } edges)
            return $"binned: {edges.Count - 1} bins of {(evo == NuisanceParameters.Names.SbEvolution ? "mu0" : "r0_kpc")} (see the figure)";
        return "not fitted";
    }

    /// <summary>The verdict, the "can the data decide" lines, the evolution statements (one per test) and the call-outs.</summary>
    public static void WriteVerdict(TextWriter o, FitResult r)
    {
        var v = r.Verdict;
        o.WriteLine($"verdict: {DecisionSummary.Headline(v)} [best: {v.Best ?? "none"}; decided: {(v.Decided ? "yes" : "no")}; strength: {v.Strength}{(v.Comparable ? "" : "; ranked: no")}]");
        foreach (var line in DecisionSummary.CanTheDataDecide(r)) o.WriteLine($"can the data decide: {line}");
        var rows = EvolutionTestTable.From(r);
        foreach (var row in rows) o.WriteLine(EvolutionTestTable.Statement(row));
        foreach (var c in DecisionSummary.Implausible(rows)) o.WriteLine($"plausibility: {c}");
    }

    /// <summary>The ranked table and the statements under it.</summary>
    public static void WriteTable(TextWriter o, FitResult r)
    {
        o.WriteLine($"{r.Source}: {r.RowsRead} rows read, {r.Accepted} accepted, {r.Rejected} rejected; observable {r.Settings.Observable.Name()}; seed {r.Seed}");
        o.WriteLine();
        string evo = r.Settings.Observable == ObservableKind.SurfaceBrightness ? NuisanceParameters.Names.SbEvolution : NuisanceParameters.Names.SizeEvolution;
        string sym = evo == NuisanceParameters.Names.SbEvolution ? "b" : "a";
        // ln L, AIC and BIC carry no error of their own: two decimals; ΔAIC/ΔBIC one (the Kass–Raftery scale needs no more);
        // the evolution estimate is rounded to its 68% interval by the PDG rule.
        o.WriteLine($"{"rank",4}  {"model",-18} {"k",2} {"ln L",12} {"AIC",11} {"ΔAIC",7} {"BIC",11} {"ΔBIC",7}  {"evidence against",-34} {sym + " (68% interval)",-22} converged");
        int rank = 0;
        var verdict = r.Verdict;
        foreach (var m in r.Models)
        {
            rank++;
            // Tied models share a rank, shown as "=1" (no order among them); models that cannot be ranked show "—".
            string shown = !verdict.Comparable ? "—" : m.Rank > 0 ? (m.Tied ? "=" : "") + m.Rank.ToString(Inv) : rank.ToString(Inv);
            string ev = EvolutionCell(m, evo, sym, r.Settings);
            string words = !verdict.Comparable ? DecisionSummary.NotRankedWords : m.Tied ? "(tied)" : rank == 1 ? "(best)" : EvidenceStrength.AgainstBest(m.DeltaBic);
            o.WriteLine(string.Create(Inv, $"{shown,4}  {SizeTest.Cosmology.WorldModelDisplayNames.For(m.Name),-18} {m.K,2} {m.LogLikelihood,12:0.00} {m.Aic,11:0.00} {m.DeltaAic,7:0.0} {m.Bic,11:0.00} {m.DeltaBic,7:0.0}  {words,-34} {ev,-22} {(m.Converged ? "yes" : "NO")}"));
        }
        o.WriteLine();
        // Compact radio sources: the size scale in pc, as ℓ_m of ℓ = ℓ_m L^β (1+z)^n (results.json keeps r0_kpc in kpc).
        if (r.Settings.CompactRadioSources)
            foreach (var m in r.Models)
            {
                var shown = m.Parameters.Select(p => (p, d: ParameterDisplay.For(p.Name, p.Unit, true))).Where(x => x.d.Converts).ToList();
                if (shown.Count > 0)
                    o.WriteLine($"{m.Name}: " + string.Join(", ", shown.Select(x => $"{x.d.Symbol} = " + (x.p.Fixed
                        ? $"{PdgRounding.Plain(x.p.Value * x.d.Scale)} (fixed)"
                        : PdgRounding.ValueWithInterval(x.p.Value * x.d.Scale, x.p.Lo * x.d.Scale, x.p.Hi * x.d.Scale)) + $" {x.d.Unit}")));
            }
        foreach (var m in r.Models)
        {
            var special = m.Parameters.Where(p => !p.Fixed && (p.IntervalMethod != IntervalMethods.Hessian || p.AtBound is not null)).ToArray();
            if (special.Length > 0)
                o.WriteLine($"{m.Name}: " + string.Join(", ", special.Select(p => $"{p.Name} {Estimate(p)}{Marker(p)}")));
            if (m.Modes.Count > 1)
                o.WriteLine($"{m.Name}: MULTIMODAL, {m.Modes.Count} maxima within Δ ln L < 2: " + string.Join("; ", m.Modes.Select(
                    md => string.Join(", ", md.Parameters.Select(kv => string.Create(Inv, $"{kv.Key} {kv.Value:0.####}"))) + string.Create(Inv, $" (ln L {md.LogLikelihood:0.00})"))));
        }
        o.WriteLine();
        WriteVerdict(o, r);
        o.WriteLine();
        foreach (var b in r.BayesFactors)
            o.WriteLine(string.Create(Inv, $"ln B({b.Favoured} : {b.Against}) = {b.LnB:0.0}{(b.LnBError is { } be ? string.Create(Inv, $" ± {be:0.0}") : "")}{(b.BicApproximate ? " (BIC approximation)" : "")}: ")
                + (verdict.Comparable ? $"{b.Strength} (Kass & Raftery 1995)" : "not a ranking (the models cannot be compared under these settings; see the verdict)"));
        foreach (var c in r.CrossValidation)
            o.WriteLine(string.Create(Inv, $"{c.Model}: {c.Folds}-fold cross-validated ln p = {c.LogPredictiveDensity:0.00} ± {c.StandardError:0.00}"));
        foreach (var d in r.CrossValidationDifferences)
            o.WriteLine(d.Tied
                ? $"{d.Model} vs {d.Reference}: cross-validated ln p tie (paired difference {d.Difference.ToString("0.00", Inv)} over the same {d.Folds} folds)"
                : string.Create(Inv, $"{d.Model} − {d.Reference}: paired cross-validated Δ ln p = {d.Difference:0.00} ± {d.StandardError:0.00} (same {d.Folds} folds)"));
        foreach (var b in r.Bootstrap)
            o.WriteLine($"{b.Model}: bootstrap of {b.Resamples} resamples ({b.Failed} failed): " + string.Join(", ", b.Intervals.Select(i => string.Create(Inv, $"{i.Name} {i.Median:0.###} [{i.Lo:0.###}, {i.Hi:0.###}]"))));
        foreach (var p in r.Profiles)
            o.WriteLine(string.Create(Inv, $"{p.Model}: profile likelihood of {p.Parameter}: 68% interval [{p.Lo:0.###}, {p.Hi:0.###}]"));
        foreach (var n in r.Notes) o.WriteLine($"note: {n}");
    }
}

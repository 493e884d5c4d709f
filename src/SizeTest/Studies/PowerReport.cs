using System.Globalization;
using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Reporting.Data;
using SizeTest.Simulation;

namespace SizeTest.Studies;

/// <summary>
/// A study's power curve from the <c>power.json</c> it names: the lines of the figure, the target and the ΔBIC threshold
/// exactly as power.json states them (not re-stated defaults), the power conclusion for this study's sample size and the
/// assumptions of the mock catalogues behind it.
/// </summary>
public static class PowerReport
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <summary>
    /// The report's power curve for a sample of <paramref name="sampleSize"/> objects fitted with <paramref name="studyModels"/>.
    /// Intervals are 68% from the binomial standard error √(p(1−p)/K) (normal approximation; common practice).
    /// </summary>
    public static PowerCurve From(PowerResult power, int sampleSize, IReadOnlyList<string> studyModels)
    {
        ArgumentNullException.ThrowIfNull(power);
        ArgumentNullException.ThrowIfNull(studyModels);
        var pts = power.Points.OrderBy(p => p.SampleSize).ToArray();
        double[] x = pts.Select(p => (double)p.SampleSize).ToArray();
        static double Lo(double p, int n) => Math.Max(0, p - Math.Sqrt(Math.Max(p * (1 - p), 0) / Math.Max(n, 1)));
        static double Hi(double p, int n) => Math.Min(1, p + Math.Sqrt(Math.Max(p * (1 - p), 0) / Math.Max(n, 1)));
        PowerLine Line(string label, Func<PowerPoint, double> f) => new(label, x, pts.Select(f).ToArray(),
            pts.Select(p => Lo(f(p), p.Mocks)).ToArray(), pts.Select(p => Hi(f(p), p.Mocks)).ToArray());
        string truth = WorldModelDisplayNames.For(power.TrueCandidate);
        return new PowerCurve("objects per catalogue", "objects",
        [
            Line($"true model ({truth}) has the lowest BIC", p => p.ProbabilityTrueBest),
            Line(string.Create(Inv, $"ΔBIC > {power.StrongDeltaBic:0.##} for the true model (strong)"), p => p.ProbabilityStrong),
            Line(string.Create(Inv, $"ΔBIC > {power.DecisiveDeltaBic:0.##} for the true model (decisive)"), p => p.ProbabilityDecisive),
        ])
        {
            Target = power.TargetPower,
            DecisionDeltaBic = power.DecisiveDeltaBic,
            Statement = Statement(power, sampleSize),
            Assumptions = Assumptions(power, studyModels),
        };
    }

    /// <summary>
    /// The power conclusion for a sample of <paramref name="n"/> objects, read at the largest N of the grid not above
    /// <paramref name="n"/> (power grows with N, so this does not overstate it): the design decides when the true model wins by
    /// ΔBIC &gt; decisive_delta_bic in at least target_power of the mocks there, and cannot decide otherwise.
    /// </summary>
    public static string Statement(PowerResult power, int n)
    {
        ArgumentNullException.ThrowIfNull(power);
        var pts = power.Points.OrderBy(p => p.SampleSize).ToArray();
        if (pts.Length == 0) return "The power analysis has no sample sizes; it says nothing about this sample.";
        string T = power.DecisiveDeltaBic.ToString("0.##", Inv), S = power.StrongDeltaBic.ToString("0.##", Inv), target = power.TargetPower.ToString("P0", Inv);
        var at = pts.LastOrDefault(p => p.SampleSize <= n);
        if (at is null)
            return string.Create(Inv, $"Power cannot be stated for this sample: it has {n} objects, fewer than the smallest mock catalogue of the power analysis (N = {pts[0].SampleSize}).");
        string with = at.SampleSize == n ? $"With {n} objects" : string.Create(Inv, $"With {at.SampleSize} objects (the largest mock catalogue not above this sample's {n})");
        if (at.Verdict == PowerAnalysis.NotInterpretable)
            return $"{with} the power analysis is not interpretable: the true model's own fit does not recover {string.Join("; ", at.RecoveryFailures)}; no power is claimed.";
        string truth = WorldModelDisplayNames.For(power.TrueCandidate);
        string strong = string.Create(Inv, $"; ΔBIC > {S} in {at.ProbabilityStrong:P0}");
        if (at.ProbabilityDecisive >= power.TargetPower)
            return string.Create(Inv, $"{with}, on mocks drawn from {truth}, the sample decides in {at.ProbabilityDecisive:P0} of {at.Mocks} mocks at ΔBIC > {T} (target {target}{strong}): this design can tell {truth} from the other candidates.");
        string need = power.RequiredSampleSize is { } r && r > at.SampleSize ? string.Create(Inv, $"; the power analysis reaches the target at N = {r}")
            : pts[^1].ProbabilityDecisive < power.TargetPower ? string.Create(Inv, $"; no sample size of the power analysis (up to {pts[^1].SampleSize}) reaches the target") : "";
        return string.Create(Inv, $"{with}, on mocks drawn from {truth}, the sample cannot decide: the true model wins by ΔBIC > {T} in only {at.ProbabilityDecisive:P0} of {at.Mocks} mocks (target {target}{strong}){need}.");
    }

    /// <summary>What the mocks assumed, one line each: the truth, the objects and redshifts, the candidates and the rule.</summary>
    public static IReadOnlyList<string> Assumptions(PowerResult power, IReadOnlyList<string> studyModels)
    {
        ArgumentNullException.ThrowIfNull(power);
        ArgumentNullException.ThrowIfNull(studyModels);
        string Values(IReadOnlyDictionary<string, double> v) => v.Count == 0 ? "" :
            " (" + string.Join(", ", v.OrderBy(p => p.Key, StringComparer.Ordinal).Select(p => string.Create(Inv, $"{p.Key} = {p.Value:0.####}"))) + ")";
        var list = new List<string>
        {
            $"mock catalogues drawn from {WorldModelDisplayNames.For(power.TrueModel)}{Values(power.TrueModelParameters)} with nuisance truths{(power.TrueNuisance.Count == 0 ? " at the defaults" : Values(power.TrueNuisance))}",
            string.Create(Inv, $"{power.Mocks} mocks per sample size ({string.Join(", ", power.Points.Select(p => p.SampleSize))} objects) of {(power.Kind == "radio" ? "compact radio sources" : power.Kind == "galaxy" ? "galaxies" : power.Kind + " objects")}, redshifts {power.ZDist}, seed {power.Seed}; each fitted as '{power.Observable.Name()}'"),
            $"candidates compared: {string.Join(", ", power.Candidates.Select(WorldModelDisplayNames.For))}",
            string.Create(Inv, $"decision rule: the true model wins by ΔBIC > {power.DecisiveDeltaBic:0.##} (BIC of the best other candidate minus the true one's) in at least {power.TargetPower:P0} of the mocks (power.json target_power and decisive_delta_bic)"),
        };
        var missing = studyModels.Where(m => !power.Candidates.Contains(m, StringComparer.Ordinal)).ToList();
        var extra = power.Candidates.Where(c => !studyModels.Contains(c, StringComparer.Ordinal)).ToList();
        if (missing.Count > 0 || extra.Count > 0)
            list.Add("the power analysis compared other models than this study fits" +
                     (missing.Count > 0 ? $" (not in it: {string.Join(", ", missing.Select(WorldModelDisplayNames.For))})" : "") +
                     (extra.Count > 0 ? $" (only in it: {string.Join(", ", extra.Select(WorldModelDisplayNames.For))})" : "") + "; its power is for that comparison");
        list.AddRange(power.Notes);
        if (power.Conclusion.Length > 0) list.Add("power.json's own conclusion over its grid: " + power.Conclusion);
        return list;
    }
}

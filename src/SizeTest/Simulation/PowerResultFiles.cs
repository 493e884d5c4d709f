using System.Globalization;
using System.Text;
using System.Text.Json;
using SizeTest.Inference;

namespace SizeTest.Simulation;

/// <summary>
/// Text forms of a <see cref="PowerResult"/>: <c>power.json</c> (snake_case, non-finite numbers as null, the same
/// conventions as results.json), <c>power.csv</c> (one row per sample size) and <c>mocks.csv</c> (one row per mock).
/// Builds strings only; the caller writes them atomically.
/// </summary>
public static class PowerResultFiles
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <summary>power.json (with a trailing newline).</summary>
    public static string Json(PowerResult result) => JsonSerializer.Serialize(result, ResultsJson.Options) + "\n";

    /// <summary>power.json read back.</summary>
    public static PowerResult ReadJson(string json) =>
        JsonSerializer.Deserialize<PowerResult>(json, ResultsJson.Options) ?? throw new JsonException("power.json is empty");

    /// <summary>
    /// power.csv: <c>n, mocks, p_true_best, p_delta_bic_gt_6, p_delta_bic_gt_10, delta_bic_q05, q16, q50, q84, q95,
    /// delta_bic_mean, not_converged, verdict</c>, then per recovered parameter <c>NAME_truth, NAME_bias, NAME_bias_err,
    /// NAME_spread, NAME_median_err, NAME_coverage</c>.
    /// </summary>
    public static string Csv(PowerResult result)
    {
        ArgumentNullException.ThrowIfNull(result);
        var names = result.Points.SelectMany(p => p.Recovery.Select(r => r.Name)).Distinct().ToArray();
        var sb = new StringBuilder();
        sb.Append("n,mocks,p_true_best,p_delta_bic_gt_6,p_delta_bic_gt_10,delta_bic_q05,delta_bic_q16,delta_bic_q50,delta_bic_q84,delta_bic_q95,delta_bic_mean,not_converged,verdict");
        foreach (var n in names) sb.Append(Inv, $",{n}_truth,{n}_bias,{n}_bias_err,{n}_spread,{n}_median_err,{n}_coverage");
        sb.Append('\n');
        foreach (var p in result.Points)
        {
            sb.Append(Inv, $"{p.SampleSize},{p.Mocks},{F(p.ProbabilityTrueBest)},{F(p.ProbabilityStrong)},{F(p.ProbabilityDecisive)}");
            foreach (var q in p.DeltaBicQuantiles) sb.Append(',').Append(F(q));
            sb.Append(',').Append(F(p.DeltaBicMean)).Append(',').Append(p.NotConverged.ToString(Inv)).Append(',').Append(p.Verdict);
            foreach (var n in names)
            {
                var r = p.Recovery.FirstOrDefault(x => x.Name == n);
                if (r is null) sb.Append(",,,,,,");
                else sb.Append(',').Append(F(r.Truth)).Append(',').Append(F(r.Bias)).Append(',').Append(F(r.BiasError)).Append(',').Append(F(r.Spread)).Append(',').Append(F(r.MedianError)).Append(',').Append(F(r.Coverage));
            }
            sb.Append('\n');
        }
        return sb.ToString();
    }

    /// <summary>mocks.csv: <c>n, mock, seed, winner, delta_bic, converged</c>, <c>bic_MODEL</c> per candidate, then the true model's estimates <c>NAME, NAME_lo, NAME_hi</c>.</summary>
    public static string MocksCsv(PowerResult result)
    {
        ArgumentNullException.ThrowIfNull(result);
        var names = result.Outcomes.SelectMany(o => o.Estimates.Select(e => e.Name)).Distinct().ToArray();
        var sb = new StringBuilder();
        sb.Append("n,mock,seed,winner,delta_bic,converged");
        foreach (var c in result.Candidates) sb.Append(",bic_").Append(c);
        foreach (var n in names) sb.Append(Inv, $",{n},{n}_lo,{n}_hi");
        sb.Append('\n');
        foreach (var o in result.Outcomes)
        {
            sb.Append(Inv, $"{o.SampleSize},{o.Mock},{o.Seed},{o.Winner},{F(o.DeltaBic)},{(o.Converged ? "true" : "false")}");
            foreach (var b in o.Bic) sb.Append(',').Append(F(b));
            foreach (var n in names)
            {
                var e = o.Estimates.FirstOrDefault(x => x.Name == n);
                if (e is null) sb.Append(",,,");
                else sb.Append(',').Append(F(e.Value)).Append(',').Append(F(e.Lo)).Append(',').Append(F(e.Hi));
            }
            sb.Append('\n');
        }
        return sb.ToString();
    }

    private static string F(double v) => double.IsFinite(v) ? v.ToString("R", Inv) : "";
}

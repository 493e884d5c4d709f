using System.Globalization;
using SizeTest.Foundation.Text;
using SizeTest.Reporting.Data;

namespace SizeTest.Reporting.Tables;

/// <summary>
/// The resampling checks of a fit, as tables: bootstrap percentile intervals beside the fit's own (Hessian or profile)
/// intervals, and k-fold cross-validated log predictive densities per model. Each is present only when the study ran it.
/// </summary>
public static class ResamplingTables
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <summary>Table id of the bootstrap comparison.</summary>
    public const string BootstrapId = "bootstrap";

    /// <summary>Table id of the cross-validation scores.</summary>
    public const string CrossValidationId = "cross-validation";

    /// <summary>
    /// Per model and free parameter: the fit's estimate and 68% interval (its method), the bootstrap median and 16th–84th
    /// percentile interval, and the width ratio (bootstrap ÷ fit). Null when no bootstrap was run.
    /// </summary>
    public static ReportTable? Bootstrap(ReportData data)
    {
        ArgumentNullException.ThrowIfNull(data);
        if (data.Bootstrap.Count == 0) return null;
        var rows = new List<IReadOnlyList<string>>();
        var raw = new List<IReadOnlyList<string>>();
        foreach (var b in data.Bootstrap)
        {
            var model = data.Models.FirstOrDefault(m => m.Fit.Name == b.Model);
            string label = model?.Label ?? Cosmology.WorldModelDisplayNames.For(b.Model);
            foreach (var iv in b.Intervals)
            {
                var p = model?.Fit.Parameters.FirstOrDefault(q => q.Name == iv.Name);
                bool hasFit = p is not null && !p.Fixed && p.Hi > p.Lo;
                double ratio = hasFit && iv.Hi > iv.Lo ? (iv.Hi - iv.Lo) / (p!.Hi - p.Lo) : double.NaN;
                rows.Add([label, iv.Name,
                    hasFit ? PdgRounding.ValueWithInterval(p!.Value, p.Lo, p.Hi) : "—",
                    hasFit ? Inference.IntervalMethods.Words(p!.IntervalMethod) : "",
                    iv.Hi > iv.Lo ? PdgRounding.ValueWithInterval(iv.Median, iv.Lo, iv.Hi) : PdgRounding.Plain(iv.Median),
                    double.IsFinite(ratio) ? ratio.ToString("0.00", Inv) : "—",
                    string.Create(Inv, $"{b.Resamples - b.Failed} of {b.Resamples}")]);
                raw.Add([b.Model, iv.Name, p is null ? "" : ReportTables.R(p.Value), hasFit ? ReportTables.R(p!.Lo) : "", hasFit ? ReportTables.R(p!.Hi) : "",
                    p?.IntervalMethod ?? "", ReportTables.R(iv.Median), ReportTables.R(iv.Lo), ReportTables.R(iv.Hi), ReportTables.R(iv.Sd),
                    double.IsFinite(ratio) ? ReportTables.R(ratio) : "", b.Resamples.ToString(Inv), b.Failed.ToString(Inv)]);
            }
        }
        return new ReportTable(BootstrapId, "Bootstrap intervals against the fit's intervals",
            ["model", "parameter", "fit (68% interval)", "interval from", "bootstrap median (16–84%)", "width ratio", "resamples used"], rows)
        {
            Caption = "The bootstrap refits each model to catalogues resampled from this one (Poisson weights, Efron 1979) and quotes the median and 16th–84th " +
                      "percentiles of the refitted values. It measures how the estimate scatters over resampled data without assuming the likelihood is quadratic " +
                      "or its scatter model right. Width ratio = bootstrap interval ÷ fit interval: near 1 the two agree; well above 1 the fit's interval understates " +
                      "the scatter (for instance when the intrinsic scatter is not log-normal as the likelihood assumes), well below 1 it is conservative; with B resamples " +
                      "the bootstrap width is uncertain by about 1/√(2B). Resamples whose refit did not converge are left out.",
            MachineColumns = ["model", "parameter", "fit_value", "fit_lo_68", "fit_hi_68", "fit_interval_method", "bootstrap_median", "bootstrap_lo_16", "bootstrap_hi_84", "bootstrap_sd", "width_ratio", "resamples", "failed"],
            MachineRows = raw,
        };
    }

    /// <summary>
    /// Per model: the folds, the cross-validated ln p with its standard error, and the paired difference from the
    /// best-scoring model with its standard error. Null when no cross-validation was run.
    /// </summary>
    public static ReportTable? CrossValidation(ReportData data)
    {
        ArgumentNullException.ThrowIfNull(data);
        if (data.CrossValidation.Count == 0) return null;
        string Label(string name) => data.Models.FirstOrDefault(m => m.Fit.Name == name)?.Label ?? Cosmology.WorldModelDisplayNames.For(name);
        var ordered = data.CrossValidation.OrderByDescending(c => c.LogPredictiveDensity).ToList();
        var rows = new List<IReadOnlyList<string>>();
        var raw = new List<IReadOnlyList<string>>();
        foreach (var c in ordered)
        {
            var d = data.CrossValidationDifferences.FirstOrDefault(x => x.Model == c.Model);
            bool reference = d is null || d.Model == d.Reference;
            rows.Add([Label(c.Model), c.Folds.ToString(Inv), ValueWithError(c.LogPredictiveDensity, c.StandardError),
                reference ? "0 (highest)" : ValueWithError(d!.Difference, d.StandardError) + (d.Tied ? " (tie)" : ""),
                c.FailedFolds.ToString(Inv)]);
            raw.Add([c.Model, c.Folds.ToString(Inv), ReportTables.R(c.LogPredictiveDensity), ReportTables.R(c.StandardError),
                d is null ? "" : ReportTables.R(d.Difference), d is null ? "" : ReportTables.R(d.StandardError), d?.Reference ?? "", c.FailedFolds.ToString(Inv)]);
        }
        return new ReportTable(CrossValidationId, "Cross-validation score per model",
            ["model", "folds", "CV ln p (± SE)", "Δ ln p from the highest (± SE)", "failed folds"], rows)
        {
            Caption = "k-fold cross-validation: each fold of objects is held out, the model is fitted to the rest, and the log density it predicts for the held-out " +
                      "objects is summed over the folds (higher predicts unseen objects better; every model uses the same folds). The standard errors are √k × the " +
                      "standard deviation over folds (Vehtari, Gelman & Gabry 2017, eqs. 23–24, applied to folds); the differences are paired by fold, and a " +
                      "difference within about two of its standard errors does not separate the two models. This score checks prediction, not the BIC ranking above.",
            MachineColumns = ["model", "folds", "cv_log_density", "cv_se", "delta_from_best", "delta_se", "reference", "failed_folds"],
            MachineRows = raw,
        };
    }

    /// <summary>Width ratios beyond this factor either way are named in <see cref="BootstrapSentence"/>.</summary>
    public const double RatioFlag = 1.5;

    /// <summary>
    /// What the bootstrap says, in one sentence: whether its intervals agree with the fit's within a factor
    /// <see cref="RatioFlag"/>, naming the parameters that do not, and how precise the ratio is with B resamples
    /// (a width from B draws is uncertain by about 1/√(2B), the relative error of a standard deviation; from memory). Null without a bootstrap.
    /// </summary>
    public static string? BootstrapSentence(ReportData data)
    {
        ArgumentNullException.ThrowIfNull(data);
        if (data.Bootstrap.Count == 0) return null;
        var off = new List<string>();
        int compared = 0;
        foreach (var b in data.Bootstrap)
        {
            var model = data.Models.FirstOrDefault(m => m.Fit.Name == b.Model);
            foreach (var iv in b.Intervals)
            {
                var p = model?.Fit.Parameters.FirstOrDefault(q => q.Name == iv.Name);
                if (p is null || p.Fixed || !(p.Hi > p.Lo) || !(iv.Hi > iv.Lo)) continue;
                compared++;
                double ratio = (iv.Hi - iv.Lo) / (p.Hi - p.Lo);
                if (ratio > RatioFlag || ratio < 1 / RatioFlag) off.Add(string.Create(Inv, $"{model!.Label} {iv.Name} ({ratio:0.00}×)"));
            }
        }
        int resamples = data.Bootstrap.Min(b => b.Resamples - b.Failed);
        string precision = resamples > 0 ? string.Create(Inv, $"; with {resamples} resamples a bootstrap width is itself uncertain by about {1 / Math.Sqrt(2.0 * resamples):P0}") : "";
        if (compared == 0) return "The bootstrap has no parameter with a fit interval to compare with.";
        return (off.Count == 0
            ? string.Create(Inv, $"Bootstrap: its intervals agree with the fit's within a factor {RatioFlag:0.#} for all {compared} parameters, so the quoted errors hold up under resampling")
            : string.Create(Inv, $"Bootstrap: its intervals differ from the fit's by more than a factor {RatioFlag:0.#} for {string.Join(", ", off)}; read those parameters' errors with the bootstrap's width")) + precision + ".";
    }

    /// <summary>
    /// What cross-validation says, in one sentence: the model that predicts held-out objects best and, for each other model,
    /// how far below it lies in standard errors of the paired difference (within 2 SE: not separated). Null without cross-validation.
    /// </summary>
    public static string? CrossValidationSentence(ReportData data)
    {
        ArgumentNullException.ThrowIfNull(data);
        if (data.CrossValidation.Count == 0) return null;
        string Label(string name) => data.Models.FirstOrDefault(m => m.Fit.Name == name)?.Label ?? Cosmology.WorldModelDisplayNames.For(name);
        var best = data.CrossValidation.MaxBy(c => c.LogPredictiveDensity)!;
        if (data.CrossValidation.Count == 1) return $"Cross-validation ({best.Folds} folds) scored only {Label(best.Model)}; there is nothing to compare it with.";
        var others = data.CrossValidationDifferences.Where(d => d.Model != d.Reference).Select(d =>
        {
            double z = d.StandardError > 0 ? -d.Difference / d.StandardError : double.NaN;
            string diff = $"{Label(d.Model)} lower by {(d.StandardError > 0 ? PdgRounding.ValueWithError(-d.Difference, d.StandardError) : PdgRounding.Plain(-d.Difference))} in ln p";
            return d.Tied || !(z >= 2) ? diff + (double.IsFinite(z) ? string.Create(Inv, $" ({z:0.0} SE: not separated)") : " (not separated)") : diff + string.Create(Inv, $" ({z:0.0} SE)");
        }).ToList();
        return $"Cross-validation ({best.Folds} folds): {Label(best.Model)} predicts held-out objects best" + (others.Count > 0 ? "; " + string.Join("; ", others) : "") + ".";
    }

    /// <summary>The sentence printed under the table <paramref name="id"/> (<see cref="BootstrapSentence"/>, <see cref="CrossValidationSentence"/>), or null.</summary>
    public static string? Sentence(ReportData data, string id) => id switch
    {
        BootstrapId => BootstrapSentence(data),
        CrossValidationId => CrossValidationSentence(data),
        _ => null,
    };

    /// <summary>The tables the study ran, in report order (bootstrap, then cross-validation).</summary>
    public static IReadOnlyList<ReportTable> All(ReportData data) =>
        new[] { Bootstrap(data), CrossValidation(data) }.OfType<ReportTable>().ToList();

    private static string ValueWithError(double v, double se) =>
        double.IsFinite(se) && se > 0 ? PdgRounding.ValueWithError(v, se) : double.IsFinite(v) ? v.ToString("0.0", Inv).Replace("-", PdgRounding.Minus, StringComparison.Ordinal) : "—";
}

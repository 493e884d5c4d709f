using System.Globalization;
using SizeTest.Reporting.Data;
using SizeTest.Reporting.Figures;

namespace SizeTest.Reporting.Tables;

/// <summary>The tables of a report, built from <see cref="ReportData"/>.</summary>
public static class ReportTables
{
    /// <summary>Best-fit parameters of every model with 68% intervals.</summary>
    public static ReportTable Parameters(ReportData data)
    {
        var rows = new List<IReadOnlyList<string>>();
        foreach (var m in data.Models)
            foreach (var p in m.Fit.Parameters)
                rows.Add([m.Label, p.Name, Num(p.Value), p.Fixed ? "" : Num(p.Lo), p.Fixed ? "" : Num(p.Hi), p.Fixed ? "fixed" : "free", p.Unit]);
        return new ReportTable("parameters", "Best-fit parameters",
            ["model", "parameter", "value", "lo_68", "hi_68", "status", "unit"], rows)
        {
            Caption = "Best estimate and 68% interval of each parameter (Hessian ±1σ for maximum likelihood, 16th–84th percentiles when sampled); fixed parameters have no interval.",
        };
    }

    /// <summary>Information criteria and weights of every model.</summary>
    public static ReportTable Comparison(ReportData data)
    {
        var bicW = ReportNumbers.BicWeights(data.Models);
        var rows = data.Models.Select((m, i) => (IReadOnlyList<string>)
        [
            m.Label, m.Fit.K.ToString(CultureInfo.InvariantCulture), m.Fit.N.ToString(CultureInfo.InvariantCulture),
            Num(m.Fit.LogLikelihood), Num(m.Fit.Aic), Num(m.Fit.Aicc), Num(m.Fit.Bic), Num(m.Fit.DeltaAic), Num(m.Fit.DeltaBic),
            Num(m.Fit.AkaikeWeight), Num(bicW[i]), m.Fit.LogEvidence is { } e ? Num(e) : "", m.Fit.Converged ? "yes" : "no",
        ]).ToList();
        return new ReportTable("comparison", "Model comparison",
            ["model", "k", "n", "ln_L", "AIC", "AICc", "BIC", "delta_AIC", "delta_BIC", "akaike_weight", "bic_weight", "ln_evidence", "converged"], rows)
        {
            Caption = "k free parameters, n objects, maximum log-likelihood ln L; AIC = 2k − 2 ln L (Akaike 1974), AICc adds 2k(k+1)/(n−k−1) (Hurvich & Tsai 1989), BIC = k ln n − 2 ln L (Schwarz 1978). " +
                      "Weights are exp(−Δ/2) normalised over the models. The ranking holds only under the stated assumptions.",
        };
    }

    /// <summary>Rows rejected per reason.</summary>
    public static ReportTable Rejects(ReportData data) => new("rejects", "Rejected rows by reason", ["reason", "rows"],
        data.Data.RejectReasons.Select(r => (IReadOnlyList<string>)[r.Reason, r.Count.ToString(CultureInfo.InvariantCulture)]).ToList())
    {
        Caption = $"{data.Data.RowsRead} rows read = {data.Data.Accepted} accepted + {data.Data.Rejected} rejected.",
    };

    /// <summary>All tables in report order.</summary>
    public static IReadOnlyList<ReportTable> All(ReportData data) => [Parameters(data), Comparison(data), Rejects(data)];

    /// <summary>Six significant digits, invariant culture, "−" never used (plain ASCII minus for CSV/LaTeX safety).</summary>
    public static string Num(double v) => double.IsFinite(v) ? v.ToString("G6", CultureInfo.InvariantCulture) : (double.IsNaN(v) ? "NaN" : (v > 0 ? "Inf" : "-Inf"));
}

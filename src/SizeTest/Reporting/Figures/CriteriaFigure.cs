using SizeTest.Reporting.Data;

namespace SizeTest.Reporting.Figures;

/// <summary>
/// Information-criterion comparison: ΔBIC and ΔAIC per model (left, with the 2/6/10 steps of
/// Kass &amp; Raftery 1995 for ΔBIC ≈ 2 ln B) and Akaike and BIC weights (right).
/// </summary>
public static class CriteriaFigure
{
    /// <summary>Figure id and file stem.</summary>
    public const string Id = "model-comparison";

    /// <summary>Builds the figure, or null with no models.</summary>
    public static FigureSpec? Build(ReportData data)
    {
        var models = data.Models;
        if (models.Count == 0) return null;
        var names = models.Select(m => m.Label).ToList();
        var bicW = ReportNumbers.BicWeights(models);
        var left = new List<SeriesSpec>
        {
            new BarSeries("ΔBIC", models.Select(m => m.Fit.DeltaBic).ToList()) { Horizontal = true, Offset = -0.18, Thickness = 0.34, Color = Palette.Model(0) },
            new BarSeries("ΔAIC", models.Select(m => m.Fit.DeltaAic).ToList()) { Horizontal = true, Offset = 0.18, Thickness = 0.34, Color = Palette.Model(1) },
        };
        double maxDelta = models.Max(m => Math.Max(m.Fit.DeltaBic, m.Fit.DeltaAic));
        // The axis ends just past the largest bar (at least 2); a guide is drawn and named only when it lies inside.
        double xMax = Math.Max(double.IsFinite(maxDelta) ? maxDelta : 0, 2.0) * 1.08;
        var steps = new[] { 2.0, 6.0, 10.0 }.Where(step => step <= xMax).ToList();
        foreach (var step in steps)
            left.Add(new ReferenceLine(step == steps[0] ? "ΔBIC = " + string.Join(", ", steps) + " (Kass & Raftery steps)" : "", step, true) { Color = Palette.Reference, Dash = DashKind.Dotted });
        var right = new List<SeriesSpec>
        {
            new BarSeries("Akaike weight", models.Select(m => m.Fit.AkaikeWeight).ToList()) { Horizontal = true, Offset = -0.18, Thickness = 0.34, Color = Palette.Model(2) },
            new BarSeries("BIC weight", bicW) { Horizontal = true, Offset = 0.18, Thickness = 0.34, Color = Palette.Model(3) },
        };
        // One spare row below the last model keeps the legend clear of the bars.
        var yAxis = new AxisSpec("model", AxisSpec.Dimensionless) { Categories = names, Inverted = true, Max = names.Count + 0.5 };
        return new FigureSpec
        {
            Id = Id,
            Title = "Information-criterion comparison",
            Caption = "Left: ΔBIC and ΔAIC of each model relative to the best (0 = preferred). Dotted lines mark those of ΔBIC = 2, 6 and 10 (the positive, strong and very strong steps of Kass & Raftery 1995) that fall inside the axis. " +
                      "Right: Akaike weights exp(−ΔAIC/2)/Σ and BIC weights exp(−ΔBIC/2)/Σ. " +
                      "These rank the models given the stated assumptions (priors, evolution form, selection model, K-corrections); they do not say which model is true.",
            Panels =
            [
                new PanelSpec { X = new AxisSpec("Δ criterion", AxisSpec.Dimensionless) { Min = 0, Max = xMax }, Y = yAxis, Series = left, Legend = LegendPlace.Below },
                new PanelSpec { X = new AxisSpec("weight", AxisSpec.Dimensionless) { Min = 0, Max = 1.05 }, Y = yAxis, Series = right, Column = 1, YAxisLabelled = false, Legend = LegendPlace.Below },
            ],
            Columns = 2,
            WidthInches = 7.2,
            HeightInches = Math.Max(2.8, 1.6 + 0.5 * models.Count),
        };
    }
}

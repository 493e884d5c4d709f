using System.Globalization;
using SizeTest.Reporting.Data;

namespace SizeTest.Reporting.Figures;

/// <summary>
/// The size evolution each model requires, without assuming its form (<c>--evolution binned:K</c>): one panel per model with
/// the fitted R0 of each redshift bin (68% intervals; horizontal bars span the bin) against 1 + z on log–log axes, and that
/// model's power-law fit R0 (1+z)^a drawn over it, a straight line on these axes. Bins that leave the line show a shape the
/// power law cannot follow.
/// </summary>
public static class BinnedEvolutionFigure
{
    /// <summary>Figure id and file stem.</summary>
    public const string Id = "binned-evolution";

    private static readonly MarkerKind[] GroupMarkers = [MarkerKind.Square, MarkerKind.Circle, MarkerKind.Diamond, MarkerKind.Triangle];
    private static readonly DashKind[] GroupDashes = [DashKind.Solid, DashKind.Dashed, DashKind.DashDot, DashKind.Dotted];
    private static readonly string[] DashWords = ["solid", "dashed", "dash-dot", "dotted"];

    /// <summary>Builds the figure, or null when no model was fitted with binned evolution.</summary>
    public static FigureSpec? Build(ReportData data)
    {
        ArgumentNullException.ThrowIfNull(data);
        var models = data.Models.Where(m => m.BinnedEvolution.Any(b => b.Bins.Count > 0)).ToList();
        if (models.Count == 0) return null;
        var groups = models.SelectMany(m => m.BinnedEvolution.Select(b => b.Group)).Distinct(StringComparer.Ordinal).ToList();
        var all = models.SelectMany(m => m.BinnedEvolution).SelectMany(b => b.Bins).ToList();
        double xMin = 1 + all.Min(b => b.ZLow), xMax = 1 + all.Max(b => b.ZHigh);
        double pad = (Math.Log10(xMax) - Math.Log10(xMin)) * 0.04;
        var xAxis = new AxisSpec("1 + z", AxisSpec.Dimensionless) { Log = true, Min = Math.Pow(10, Math.Log10(xMin) - pad), Max = Math.Pow(10, Math.Log10(xMax) + pad) };
        int columns = models.Count == 1 ? 1 : 2;
        int rows = (models.Count + columns - 1) / columns;
        var panels = new List<PanelSpec>();
        for (int i = 0; i < models.Count; i++)
        {
            var m = models[i];
            string color = ModelStyles.Color(m.Fit.Name);
            var series = new List<SeriesSpec>();
            var notes = new List<string>();
            foreach (var evo in m.BinnedEvolution.Where(b => b.Bins.Count > 0))
            {
                int g = groups.IndexOf(evo.Group);
                string who = evo.Group.Length == 0 ? "" : $", {evo.Group}";
                var bins = evo.Bins;
                series.Add(new BinnedSeries("", bins.Select(b => 1 + b.ZLow).ToList(), bins.Select(b => 1 + b.ZHigh).ToList(),
                    bins.Select(b => b.R0Kpc).ToList(), bins.Select(b => b.Lo).ToList(), bins.Select(b => b.Hi).ToList())
                {
                    Color = color, Marker = GroupMarkers[g % GroupMarkers.Length], XCentre = bins.Select(b => 1 + b.ZEffective).ToList(),
                });
                if (evo.PowerLaw is { } law)
                {
                    var curve = Curve.Sample(x => law.At(x - 1), xMin, xMax, 60);
                    series.Add(new LineSeries("", curve.X, curve.Y)
                    {
                        Color = color, Dash = GroupDashes[g % GroupDashes.Length], Width = 1.5,
                    });
                    notes.Add(string.Create(CultureInfo.InvariantCulture, $"{(evo.Group.Length == 0 ? "" : evo.Group + ": ")}a = {law.SizeEvolution:0.00} [{law.Lo:0.00}, {law.Hi:0.00}]"));
                }
            }
            if (i == 0)
            {
                // One neutral legend for every panel (the colours are the models', named in each panel's corner).
                series.Add(new LegendKey("line: the same model fitted with R0 (1+z)^a; squares: R0 fitted per redshift bin (68%)") { Color = Palette.Ink, Dash = DashKind.Solid });
                if (groups.Count > 1)
                    for (int g = 0; g < groups.Count; g++)
                        series.Add(new LegendKey($"{DashWords[g % DashWords.Length]}: {groups[g]}") { Color = Palette.Ink, Dash = GroupDashes[g % GroupDashes.Length] });
            }
            panels.Add(new PanelSpec
            {
                X = xAxis, Y = YAxis(m.BinnedEvolution, xMin, xMax), Series = series,
                Row = i / columns, Column = i % columns, Legend = i == 0 ? LegendPlace.Below : LegendPlace.None,
                XAxisLabelled = i + columns >= models.Count, YAxisLabelled = true, // each model has its own R0 scale
                Note = m.Label + (notes.Count > 0 ? ": " + string.Join("; ", notes) : ""),
            });
        }
        return new FigureSpec
        {
            Id = Id,
            Title = "Size evolution each model requires, bin by bin",
            Caption = "For each world model, the physical size R0 fitted freely in each redshift bin (binned evolution) with its 68% interval, against 1 + z " +
                      "on logarithmic axes; horizontal bars span each bin, and each point sits where the bin measures a power law exactly " +
                      "(the precision-weighted geometric mean of 1 + z of its objects). The line is the same model fitted with R(z) = R0 (1+z)^a to the same objects " +
                      "(its a and 68% interval in the panel's corner); a power law is straight here. Bins that leave the line show evolution of a shape " +
                      "the single exponent cannot follow. Sizes are in each model's own distances, so the panels' R0 scales differ." +
                      (groups.Count > 1 ? " Populations are told apart by marker (square, circle, diamond, triangle in the legend's order) and line style." : ""),
            Panels = panels,
            Columns = columns,
            RowHeights = Enumerable.Repeat(1.0, rows).ToArray(),
            HeightInches = 1.0 + 2.6 * rows,
        };
    }

    /// <summary>Minimum span of the R0 axis, dex: a narrower range (a model needing almost no evolution) leaves the log axis no inner ticks.</summary>
    private const double MinSpanDex = 0.3;

    /// <summary>The log R0 axis of one panel: the bins' intervals and the power law over the x range, widened about its centre to <see cref="MinSpanDex"/>.</summary>
    private static AxisSpec YAxis(IReadOnlyList<BinnedSizeEvolution> evolutions, double xMin, double xMax)
    {
        var axis = new AxisSpec("R0 of the bin", "kpc") { Log = true };
        var values = new List<double>();
        foreach (var evo in evolutions)
        {
            values.AddRange(evo.Bins.SelectMany(b => new[] { b.Lo, b.Hi, b.R0Kpc }));
            if (evo.PowerLaw is { } law) values.AddRange([law.At(xMin - 1), law.At(xMax - 1)]);
        }
        values = values.Where(v => v > 0 && double.IsFinite(v)).ToList();
        if (values.Count == 0) return axis;
        double lo = Math.Log10(values.Min()), hi = Math.Log10(values.Max());
        if (hi - lo >= MinSpanDex) return axis;
        double mid = (lo + hi) / 2;
        return axis with { Min = Math.Pow(10, mid - MinSpanDex / 2), Max = Math.Pow(10, mid + MinSpanDex / 2) };
    }
}

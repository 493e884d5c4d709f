using System.Globalization;
using SizeTest.Reporting.Data;

namespace SizeTest.Reporting.Figures;

/// <summary>
/// The evolution each model requires, without assuming its form (<c>--evolution binned:K</c>): per model a panel with the fitted
/// R0 of each redshift bin (68% intervals; horizontal bars span the bin) against 1 + z on log–log axes, and that model's
/// power-law fit R0 (1+z)^a drawn over it, a straight line on these axes; with surface brightnesses (sb, joint) a second panel
/// with the fitted μ0 of each bin (dimming removed) and the power-law fit's μ0 − 2.5 b log10(1+z), also straight against
/// log (1+z). Bins that leave the line show a shape the power law cannot follow.
/// </summary>
public static class BinnedEvolutionFigure
{
    /// <summary>Figure id and file stem.</summary>
    public const string Id = "binned-evolution";

    private static readonly MarkerKind[] GroupMarkers = [MarkerKind.Square, MarkerKind.Circle, MarkerKind.Diamond, MarkerKind.Triangle];
    private static readonly DashKind[] GroupDashes = [DashKind.Solid, DashKind.Dashed, DashKind.DashDot, DashKind.Dotted];
    private static readonly string[] DashWords = ["solid", "dashed", "dash-dot", "dotted"];

    /// <summary>One bin as drawn: edges, where it sits, value and 68% interval.</summary>
    private readonly record struct Bin(double ZLow, double ZHigh, double ZEffective, double Value, double Lo, double Hi);

    /// <summary>One population's bins with its power law (value at z and the exponent with its interval), or none.</summary>
    private sealed record Track(string Group, IReadOnlyList<Bin> Bins, Func<double, double>? Law, double Exponent, double Lo, double Hi);

    /// <summary>What a panel kind draws: its y axis, the exponent's symbol and the legend's words.</summary>
    private sealed record Quantity(AxisSpec Axis, double MinSpan, string Symbol, string Legend);

    private static readonly Quantity Size = new(new AxisSpec("R0 of the bin", "kpc") { Log = true }, 0.3, "a",
        "line: the same model fitted with R0 (1+z)^a; squares: R0 fitted per redshift bin (68%)");

    private static readonly Quantity Brightness = new(new AxisSpec("μ0 of the bin", "mag/arcsec²"), 0.4, "b",
        "line: the same model fitted with μ0 − 2.5 b log10(1+z); squares: μ0 fitted per redshift bin (68%)");

    /// <summary>Builds the figure, or null when no model was fitted with binned evolution.</summary>
    public static FigureSpec? Build(ReportData data)
    {
        ArgumentNullException.ThrowIfNull(data);
        var models = data.Models.Select(m => (Model: m, Size: SizeTracks(m), Sb: SbTracks(m))).Where(m => m.Size.Count > 0 || m.Sb.Count > 0).ToList();
        if (models.Count == 0) return null;
        bool anySize = models.Any(m => m.Size.Count > 0), anySb = models.Any(m => m.Sb.Count > 0), both = anySize && anySb;
        var groups = models.SelectMany(m => m.Size.Concat(m.Sb).Select(t => t.Group)).Distinct(StringComparer.Ordinal).ToList();
        var all = models.SelectMany(m => m.Size.Concat(m.Sb)).SelectMany(t => t.Bins).ToList();
        double xMin = 1 + all.Min(b => b.ZLow), xMax = 1 + all.Max(b => b.ZHigh);
        double pad = (Math.Log10(xMax) - Math.Log10(xMin)) * 0.04;
        var xAxis = new AxisSpec("1 + z", AxisSpec.Dimensionless) { Log = true, Min = Math.Pow(10, Math.Log10(xMin) - pad), Max = Math.Pow(10, Math.Log10(xMax) + pad) };
        // Sizes and surface brightnesses: one row per model, R0 left and μ0 right; one quantity: the models in a grid of up to two columns.
        int columns = both || models.Count > 1 ? 2 : 1;
        int rows = both ? models.Count : (models.Count + columns - 1) / columns;
        var panels = new List<PanelSpec>();
        int firstSize = models.FindIndex(m => m.Size.Count > 0), firstSb = models.FindIndex(m => m.Sb.Count > 0);
        for (int i = 0; i < models.Count; i++)
        {
            var (m, size, sb) = models[i];
            int row = both ? i : i / columns, column = both ? 0 : i % columns;
            if (size.Count > 0) panels.Add(Panel(m, size, Size, groups, xAxis, xMin, xMax, row, column, i == firstSize, withGroups: true));
            if (sb.Count > 0) panels.Add(Panel(m, sb, Brightness, groups, xAxis, xMin, xMax, row, both ? 1 : column, i == firstSb, withGroups: !anySize));
        }
        // A panel labels its x axis when no panel sits below it in its column.
        panels = panels.Select(p => p with { XAxisLabelled = !panels.Any(q => q.Column == p.Column && q.Row > p.Row) }).ToList();
        var bare = models.Where(m => m.Size.Concat(m.Sb).Any(t => t.Law is null)).Select(m => m.Model.Label).ToList();
        bool kormendy = anySb && models.Any(m => m.Sb.Count > 0 && m.Model.Fit.Parameters.Any(p => p.Name == Inference.NuisanceParameters.Names.KormendySlope && p.Value != 0));
        string sizeText = "the physical size R0 fitted freely in each redshift bin (binned evolution) with its 68% interval, against 1 + z on logarithmic axes";
        string sbText = "the surface brightness μ0 fitted freely in each redshift bin with the world model's own dimming 2.5 n log10(1+z) removed, with its 68% interval, " +
                        "against 1 + z on a logarithmic axis";
        return new FigureSpec
        {
            Id = Id,
            Title = anySb ? "Evolution each model requires, bin by bin" : "Size evolution each model requires, bin by bin",
            Caption = "For each world model, " + (both ? $"left {sizeText}; right {sbText}" : anySize ? sizeText : sbText) +
                      "; horizontal bars span each bin, and each point sits where the bin measures a power law exactly " +
                      "(the precision-weighted geometric mean of 1 + z of its objects). The line is the same model fitted to the same objects with " +
                      (anySize ? "R(z) = R0 (1+z)^a" : "") + (both ? " and " : "") + (anySb ? "μ0 − 2.5 b log10(1+z), L ∝ (1+z)^b" : "") +
                      " (its exponent and 68% interval in the panel's corner); a power law is straight here. Bins that leave the line show evolution of a shape " +
                      "the single exponent cannot follow." +
                      (anySize ? " Sizes are in each model's own distances, so the panels' R0 scales differ." : "") +
                      (anySb ? " The μ0 bins differ between models by their dimming laws." : "") +
                      (kormendy ? " With the size–SB slope κ fitted, a μ0 bin also takes up κ times its bin's size offset from the power law, so there the comparison is approximate." : "") +
                      (bare.Count > 0 ? $" No power law is drawn for {string.Join(", ", bare)}: its power-law refit did not converge, so the panel shows the bins alone." : "") +
                      (groups.Count > 1 ? " Populations are told apart by marker (square, circle, diamond, triangle in the legend's order) and line style." : ""),
            Panels = panels,
            Columns = columns,
            RowHeights = Enumerable.Repeat(1.0, rows).ToArray(),
            HeightInches = 1.0 + 2.6 * rows,
        };
    }

    private static List<Track> SizeTracks(ModelReport m) => m.BinnedEvolution.Where(e => e.Bins.Count > 0).Select(e => new Track(e.Group,
        e.Bins.Select(b => new Bin(b.ZLow, b.ZHigh, b.ZEffective, b.R0Kpc, b.Lo, b.Hi)).ToList(),
        e.PowerLaw is { } law ? law.At : null, e.PowerLaw?.SizeEvolution ?? double.NaN, e.PowerLaw?.Lo ?? double.NaN, e.PowerLaw?.Hi ?? double.NaN)).ToList();

    private static List<Track> SbTracks(ModelReport m) => m.BinnedSurfaceBrightness.Where(e => e.Bins.Count > 0).Select(e => new Track(e.Group,
        e.Bins.Select(b => new Bin(b.ZLow, b.ZHigh, b.ZEffective, b.Mu0, b.Lo, b.Hi)).ToList(),
        e.PowerLaw is { } law ? law.At : null, e.PowerLaw?.SbEvolution ?? double.NaN, e.PowerLaw?.Lo ?? double.NaN, e.PowerLaw?.Hi ?? double.NaN)).ToList();

    /// <summary>One model's panel of one quantity; <paramref name="first"/> carries the legend (the groups' line styles too when <paramref name="withGroups"/>).</summary>
    private static PanelSpec Panel(ModelReport m, List<Track> tracks, Quantity q, List<string> groups, AxisSpec xAxis, double xMin, double xMax,
        int row, int column, bool first, bool withGroups)
    {
        string color = ModelStyles.Color(m.Fit.Name);
        var series = new List<SeriesSpec>();
        var notes = new List<string>();
        foreach (var t in tracks)
        {
            int g = groups.IndexOf(t.Group);
            var bins = t.Bins;
            series.Add(new BinnedSeries("", bins.Select(b => 1 + b.ZLow).ToList(), bins.Select(b => 1 + b.ZHigh).ToList(),
                bins.Select(b => b.Value).ToList(), bins.Select(b => b.Lo).ToList(), bins.Select(b => b.Hi).ToList())
            {
                Color = color, Marker = GroupMarkers[g % GroupMarkers.Length], XCentre = bins.Select(b => 1 + b.ZEffective).ToList(),
            });
            if (t.Law is not { } law) continue;
            var curve = Curve.Sample(x => law(x - 1), xMin, xMax, 60);
            series.Add(new LineSeries("", curve.X, curve.Y) { Color = color, Dash = GroupDashes[g % GroupDashes.Length], Width = 1.5 });
            notes.Add(string.Create(CultureInfo.InvariantCulture, $"{(t.Group.Length == 0 ? "" : t.Group + ": ")}{q.Symbol} = {t.Exponent:0.00} [{t.Lo:0.00}, {t.Hi:0.00}]"));
        }
        if (first)
        {
            // One neutral legend for every panel (the colours are the models', named in each panel's corner).
            series.Add(new LegendKey(q.Legend) { Color = Palette.Ink, Dash = DashKind.Solid });
            if (withGroups && groups.Count > 1)
                for (int g = 0; g < groups.Count; g++)
                    if (groups[g].Length > 0) // a model fitted as one population keeps its line style without a key
                        series.Add(new LegendKey($"{DashWords[g % DashWords.Length]}: {groups[g]}") { Color = Palette.Ink, Dash = GroupDashes[g % GroupDashes.Length] });
        }
        return new PanelSpec
        {
            X = xAxis, Y = YAxis(tracks, q, xMin, xMax), Series = series,
            Row = row, Column = column, Legend = first ? LegendPlace.Below : LegendPlace.None,
            YAxisLabelled = true, // each model has its own scale
            Note = m.Label + (notes.Count > 0 ? ": " + string.Join("; ", notes) : ""),
        };
    }

    /// <summary>
    /// The y axis of one panel: the bins' intervals and the power law over the x range, widened about its centre to the quantity's
    /// minimum span (dex on the log R0 axis, mag on the μ0 axis): a narrower range leaves the axis no inner ticks.
    /// </summary>
    private static AxisSpec YAxis(List<Track> tracks, Quantity q, double xMin, double xMax)
    {
        var values = new List<double>();
        foreach (var t in tracks)
        {
            values.AddRange(t.Bins.SelectMany(b => new[] { b.Lo, b.Hi, b.Value }));
            if (t.Law is { } law) values.AddRange([law(xMin - 1), law(xMax - 1)]);
        }
        Func<double, double> to = q.Axis.Log ? Math.Log10 : v => v, from = q.Axis.Log ? v => Math.Pow(10, v) : v => v;
        values = values.Where(v => double.IsFinite(v) && (!q.Axis.Log || v > 0)).Select(to).ToList();
        if (values.Count == 0) return q.Axis;
        double lo = values.Min(), hi = values.Max();
        if (hi - lo >= q.MinSpan) return q.Axis;
        double mid = (lo + hi) / 2;
        return q.Axis with { Min = from(mid - q.MinSpan / 2), Max = from(mid + q.MinSpan / 2) };
    }
}

using System.Globalization;
using ScottPlot;
using SizeTest.Reporting.Figures;
using SkiaSharp;
using Color = ScottPlot.Color;
using BarSeries = SizeTest.Reporting.Figures.BarSeries;
using Palette = SizeTest.Reporting.Figures.Palette;

namespace SizeTest.Reporting.Rendering;

/// <summary>
/// Turns a <see cref="FigureSpec"/> into a 300-dpi PNG, an SVG or a vector PDF. This is the
/// only code in SizeTest that uses the plotting library (ScottPlot 5); everything else works
/// on figure records.
/// </summary>
/// <remarks>
/// Layout is done in logical pixels at 96 per inch; a figure of W × H inches is
/// 96W × 96H logical pixels, drawn scaled to 300/96 for PNG and 72/96 for PDF points.
/// Log axes are drawn in log10 coordinates with <see cref="LogAxisTicks"/>; axis limits are
/// computed here from the series (data range plus a 4% margin) unless the spec fixes them,
/// and are reported back in <see cref="RenderedFigure"/> so tests can check them.
/// Fonts come only from <see cref="FontRegistry"/> (embedded DejaVu Sans).
/// </remarks>
public static class FigureRenderer
{
    /// <summary>Logical pixels per inch of the layout.</summary>
    public const double LogicalDpi = 96.0;

    /// <summary>Default PNG resolution, dots per inch.</summary>
    public const double DefaultPngDpi = 300.0;

    // Font sizes of the figure being laid out (set from FigureSpec.Fonts by LogicalSize and Draw; one figure per thread at a time).
    [ThreadStatic] private static FigureFonts? currentFonts;
    private static FigureFonts CurrentFonts => currentFonts ?? FigureFonts.Screen;
    private static float TickFontPx => Px(CurrentFonts.TickPoints);
    private static float AxisFontPx => Px(CurrentFonts.AxisPoints);
    private static float TitleFontPx => Px(CurrentFonts.TitlePoints);
    private static float LegendFontPx => Px(CurrentFonts.LegendPoints);
    private const double Margin = 0.04;
    private static readonly object FontLock = new();
    private static bool fontsRegistered;

    /// <summary>Logical size (96-dpi pixels) of a figure, including the legend band under the panels.</summary>
    public static (float Width, float Height) LogicalSize(FigureSpec spec)
    {
        ArgumentNullException.ThrowIfNull(spec);
        currentFonts = spec.Fonts;
        float w = (float)(spec.WidthInches * LogicalDpi);
        return (w, (float)(spec.HeightInches * LogicalDpi) + LegendBand(spec, w).Height);
    }

    /// <summary>The legend entries of the panels that put their legend below the axes (one per label).</summary>
    private static List<SeriesSpec> BelowEntries(FigureSpec spec) =>
        spec.Panels.Where(p => p.Legend == LegendPlace.Below).SelectMany(p => p.Series)
            .Where(s => s.Label.Length > 0).DistinctBy(s => s.Label).ToList();

    private const float LegendSymbolPx = 28f, LegendGapPx = 14f, LegendPadPx = 8f;

    /// <summary>Height of the legend band and its column layout: as many equal columns as the widest entry allows.</summary>
    private static (float Height, int Columns, float ColumnWidth, List<SeriesSpec> Entries) LegendBand(FigureSpec spec, float width)
    {
        var entries = BelowEntries(spec);
        if (entries.Count == 0) return (0f, 0, 0f, entries);
        EnsureFonts();
        using var font = new SKFont(FontRegistry.Regular, LegendFontPx);
        float widest = entries.Max(e => font.MeasureText(e.Label)) + LegendSymbolPx + LegendGapPx;
        int cols = Math.Max(1, Math.Min(entries.Count, (int)((width - 2 * LegendPadPx) / widest)));
        int rows = (entries.Count + cols - 1) / cols;
        float line = LegendFontPx * 1.55f;
        return (rows * line + 2 * LegendPadPx, cols, (width - 2 * LegendPadPx) / cols, entries);
    }

    private static SKPathEffect? Dash(DashKind d, float scale) => d switch
    {
        DashKind.Dashed => SKPathEffect.CreateDash([6f * scale, 3f * scale], 0),
        DashKind.Dotted => SKPathEffect.CreateDash([1.5f * scale, 2.5f * scale], 0),
        DashKind.DashDot => SKPathEffect.CreateDash([8f * scale, 3f * scale, 2f * scale, 3f * scale], 0),
        _ => null,
    };

    /// <summary>Draws the legend band under the panels (outside every axis, so it covers no data); returns its box.</summary>
    private static SKRect DrawLegendBand(SKCanvas canvas, FigureSpec spec, float top, float width)
    {
        var (height, cols, colW, entries) = LegendBand(spec, width);
        if (entries.Count == 0) return SKRect.Empty;
        const float k = 1f;
        using var font = new SKFont(FontRegistry.Regular, LegendFontPx * k) { Subpixel = true };
        using var text = new SKPaint { Color = SKColors.Black, IsAntialias = true };
        float line = LegendFontPx * k * 1.55f;
        for (int i = 0; i < entries.Count; i++)
        {
            var e = entries[i];
            int r = i / cols, c = i % cols;
            float x = LegendPadPx + c * colW, yMid = top + LegendPadPx + r * line + line / 2;
            var color = SKColor.Parse(e.Color).WithAlpha((byte)Math.Round(255 * Math.Clamp(e.Alpha, 0.35, 1)));
            using var paint = new SKPaint { Color = color, IsAntialias = true, StrokeWidth = 1.6f * k, Style = SKPaintStyle.Stroke };
            float sw = LegendSymbolPx * k;
            switch (e)
            {
                case LineSeries l:
                    paint.StrokeWidth = Px(l.Width);
                    paint.PathEffect = Dash(l.Dash, k);
                    canvas.DrawLine(x, yMid, x + sw, yMid, paint);
                    break;
                case LegendKey lk:
                    paint.PathEffect = Dash(lk.Dash, k);
                    canvas.DrawLine(x, yMid, x + sw, yMid, paint);
                    break;
                case ReferenceLine rl:
                    paint.PathEffect = Dash(rl.Dash, k);
                    canvas.DrawLine(x, yMid, x + sw, yMid, paint);
                    break;
                case BinnedSeries:
                    canvas.DrawLine(x + 2, yMid, x + sw - 2, yMid, paint);
                    paint.Style = SKPaintStyle.Fill;
                    canvas.DrawRect(x + sw / 2 - 3.5f * k, yMid - 3.5f * k, 7f * k, 7f * k, paint);
                    break;
                case PointSeries:
                    paint.Style = SKPaintStyle.Fill;
                    canvas.DrawCircle(x + sw / 2, yMid, 3f * k, paint);
                    break;
                case DensitySeries:
                    paint.Style = SKPaintStyle.Fill;
                    paint.Color = SKColor.Parse(Palette.DensityHigh).WithAlpha(170);
                    canvas.DrawRect(x + 4, yMid - 5 * k, sw - 8, 10 * k, paint);
                    break;
                default:
                    paint.Style = SKPaintStyle.Fill;
                    canvas.DrawRect(x + 4, yMid - 5 * k, sw - 8, 10 * k, paint);
                    break;
            }
            canvas.DrawText(e.Label, x + sw + 6f * k, yMid + LegendFontPx * k * 0.36f, SKTextAlign.Left, font, text);
        }
        return new SKRect(0, top, width, top + height);
    }

    /// <summary>Renders a PNG at <paramref name="dpi"/> (default 300) on a white background.</summary>
    public static RenderedPng RenderPng(FigureSpec spec, double dpi = DefaultPngDpi)
    {
        var (w, h) = LogicalSize(spec);
        float scale = (float)(dpi / LogicalDpi);
        int pw = (int)Math.Round(w * scale), ph = (int)Math.Round(h * scale);
        using var surface = SKSurface.Create(new SKImageInfo(pw, ph, SKColorType.Rgba8888, SKAlphaType.Premul))
                            ?? throw new InvalidOperationException("could not create a drawing surface");
        var canvas = surface.Canvas;
        canvas.Clear(SKColors.White);
        canvas.Scale(scale);
        var layout = Draw(canvas, spec);
        canvas.Flush();
        using var image = surface.Snapshot();
        using var data = image.Encode(SKEncodedImageFormat.Png, 100);
        return new RenderedPng(data.ToArray(), pw, ph, scale, layout);
    }

    /// <summary>Renders an SVG document (size in logical pixels, with a viewBox so it scales).</summary>
    public static string RenderSvg(FigureSpec spec)
    {
        var (w, h) = LogicalSize(spec);
        using var ms = new MemoryStream();
        using (var canvas = SKSvgCanvas.Create(new SKRect(0, 0, w, h), ms))
        {
            using var bg = new SKPaint { Color = SKColors.White, Style = SKPaintStyle.Fill };
            canvas.DrawRect(new SKRect(0, 0, w, h), bg);
            Draw(canvas, spec);
        }
        var svg = System.Text.Encoding.UTF8.GetString(ms.ToArray());
        return RenumberIds(AddViewBox(svg, w, h), spec.Id);
    }

    /// <summary>Renders a one-page vector PDF of the figure's physical size.</summary>
    public static byte[] RenderPdf(FigureSpec spec)
    {
        var (w, h) = LogicalSize(spec);
        float k = (float)(72.0 / LogicalDpi);
        using var ms = new MemoryStream();
        var meta = new SKDocumentPdfMetadata { Title = spec.Title, Creator = "SizeTest", Producer = "SizeTest (SkiaSharp PDF)", Creation = null, Modified = null };
        using (var doc = SKDocument.CreatePdf(ms, meta))
        {
            var canvas = doc.BeginPage(w * k, h * k);
            canvas.Scale(k);
            Draw(canvas, spec);
            doc.EndPage();
            doc.Close();
        }
        return ms.ToArray();
    }

    /// <summary>
    /// Draws the figure onto any canvas whose current transform maps logical pixels to device
    /// units (used by the PDF report to place vector figures on its pages).
    /// </summary>
    public static RenderedFigure Draw(SKCanvas canvas, FigureSpec spec)
    {
        ArgumentNullException.ThrowIfNull(canvas);
        ArgumentNullException.ThrowIfNull(spec);
        EnsureFonts();
        var (w, _) = LogicalSize(spec); // also selects spec.Fonts
        float h = (float)(spec.HeightInches * LogicalDpi); // panels; the legend band goes underneath
        int rows = spec.RowHeights.Count;
        double total = spec.RowHeights.Sum();
        var rowTop = new float[rows + 1];
        for (int r = 0; r < rows; r++) rowTop[r + 1] = rowTop[r] + (float)(h * spec.RowHeights[r] / total);
        float colWidth = w / spec.Columns;

        // Left padding per column: wide enough for the widest tick label in that column, so stacked panels align.
        var leftPad = new float[spec.Columns];
        var prepared = spec.Panels.Select(p => Prepare(p)).ToList();
        for (int i = 0; i < prepared.Count; i++)
        {
            var p = prepared[i];
            float need = p.Spec.YAxisLabelled ? 12f + AxisFontPx + MeasureWidest(p.YTicks, p.Spec.Y) : 10f;
            leftPad[p.Spec.Column] = Math.Max(leftPad[p.Spec.Column], need);
        }

        // The figure title is drawn once, centred over the whole width; row-0 panels leave room for it.
        bool titled = spec.Title.Length > 0;
        float titleBand = titled ? TitleFontPx + 20f : 0f;
        var panels = new List<RenderedPanel>();
        foreach (var p in prepared)
        {
            var ps = p.Spec;
            var cell = new PixelRect(ps.Column * colWidth, (ps.Column + 1) * colWidth, rowTop[ps.Row + 1], rowTop[ps.Row]);
            var pad = new PixelPadding(
                leftPad[ps.Column],
                spec.Columns > 1 ? 6f : 14f,
                ps.XAxisLabelled ? 14f + AxisFontPx + TickFontPx + 8f : 4f,
                ps.Row == 0 ? (titled ? titleBand : 10f) : 4f);
            panels.Add(DrawPanel(canvas, p, cell, pad, ""));
        }
        if (titled)
        {
            using var font = new SKFont(FontRegistry.Bold, TitleFontPx) { Subpixel = true };
            using var paint = new SKPaint { Color = SKColors.Black, IsAntialias = true };
            canvas.DrawText(spec.Title, w / 2f, TitleFontPx + 6f, SKTextAlign.Center, font, paint);
        }
        var legend = DrawLegendBand(canvas, spec, h, w);
        return new RenderedFigure(w, h + (legend.IsEmpty ? 0 : legend.Height), panels) { LegendRect = legend };
    }

    private sealed record PreparedPanel(PanelSpec Spec, double XMin, double XMax, double YMin, double YMax,
        IReadOnlyList<AxisTick>? XTicks, IReadOnlyList<AxisTick>? YTicks);

    private static PreparedPanel Prepare(PanelSpec p)
    {
        var (x0, x1) = Limits(p.X, p.Series.SelectMany(s => s.XExtent()));
        var (y0, y1) = Limits(p.Y, p.Series.SelectMany(s => s.YExtent()));
        // A panel note sits in the upper-left corner: give it headroom so it does not cover data.
        if (p.Note.Length > 0 && p.Y.Categories is null)
        {
            if (!p.Y.Inverted && p.Y.Max is null) y1 += 0.25 * (y1 - y0);
            else if (p.Y.Inverted && p.Y.Min is null) y0 -= 0.25 * (y1 - y0);
        }
        return new PreparedPanel(p, x0, x1, y0, y1, Ticks(p.X, x0, x1), Ticks(p.Y, y0, y1));
    }

    /// <summary>Axis limits in drawn coordinates (log10 on a log axis).</summary>
    private static (double, double) Limits(AxisSpec axis, IEnumerable<double> values)
    {
        if (axis.Categories is { } cats)
            return (axis.Min ?? -0.6, axis.Max ?? cats.Count - 0.4);
        double lo = double.PositiveInfinity, hi = double.NegativeInfinity;
        foreach (var v in values)
        {
            double t = T(axis, v);
            if (!double.IsFinite(t)) continue;
            if (t < lo) lo = t;
            if (t > hi) hi = t;
        }
        if (lo > hi) { lo = axis.Log ? -1 : 0; hi = axis.Log ? 1 : 1; }
        if (hi - lo < 1e-12) { double d = axis.Log ? 0.1 : Math.Max(Math.Abs(lo) * 0.1, 0.5); lo -= d; hi += d; }
        double pad = (hi - lo) * Margin;
        double a = axis.Min is { } mn ? T(axis, mn) : lo - pad;
        double b = axis.Max is { } mx ? T(axis, mx) : hi + pad;
        return (a, b);
    }

    private static double T(AxisSpec axis, double v) => axis.Log ? (v > 0 ? Math.Log10(v) : double.NaN) : v;

    private static IReadOnlyList<AxisTick>? Ticks(AxisSpec axis, double lo, double hi)
    {
        if (axis.Categories is { } cats)
            return cats.Select((c, i) => new AxisTick(i, c, true)).ToList();
        if (axis.InnerTicks && !axis.Log) return InnerTicks(lo, hi);
        return axis.Log ? LogAxisTicks.Generate(lo, hi) : null;
    }

    /// <summary>Up to three ticks at multiples of a 1–2–5 step within the inner 80% of [lo, hi].</summary>
    internal static IReadOnlyList<AxisTick> InnerTicks(double lo, double hi)
    {
        if (hi < lo) (lo, hi) = (hi, lo);
        double span = hi - lo;
        if (!(span > 0)) return [new AxisTick(lo, FormatLinear(lo), true)];
        double raw = span / 3, mag = Math.Pow(10, Math.Floor(Math.Log10(raw)));
        double step = new[] { 1.0, 2.0, 5.0, 10.0 }.Select(f => f * mag).First(v => v >= raw * 0.75);
        double a = lo + 0.1 * span, b = hi - 0.1 * span;
        var ticks = new List<AxisTick>();
        for (double t = Math.Ceiling(a / step) * step; t <= b + 1e-12 * span; t += step)
            ticks.Add(new AxisTick(Math.Abs(t) < 1e-12 * span ? 0 : t, FormatLinear(Math.Round(t / step) * step), true));
        if (ticks.Count == 0) ticks.Add(new AxisTick(0.5 * (lo + hi), FormatLinear(Math.Round(0.5 * (lo + hi) / step) * step), true));
        return ticks;
    }

    private static float MeasureWidest(IReadOnlyList<AxisTick>? ticks, AxisSpec axis)
    {
        using var font = new SKFont(FontRegistry.Regular, TickFontPx);
        IEnumerable<string> labels = ticks is not null
            ? ticks.Where(t => t.Major).Select(t => t.Label)
            : [FormatEstimate(axis.Min ?? -1000), "-0.000"];
        float w = labels.Select(l => font.MeasureText(l)).DefaultIfEmpty(20f).Max();
        return Math.Max(w, 24f) + 10f;
    }

    private static string FormatEstimate(double v) => v.ToString("G4", CultureInfo.InvariantCulture);

    private static RenderedPanel DrawPanel(SKCanvas canvas, PreparedPanel pp, PixelRect cell, PixelPadding pad, string title)
    {
        var ps = pp.Spec;
        using var plot = new Plot();
        plot.RenderManager.ClearCanvasBeforeEachRender = false;
        plot.FigureBackground.Color = Colors.Transparent;
        plot.DataBackground.Color = Colors.White;
        plot.Font.Set(FontRegistry.Family);
        plot.Layout.Fixed(pad);
        plot.Grid.MajorLineColor = Color.FromHex("#E6E6E6");
        plot.Grid.MinorLineColor = Colors.Transparent;

        if (title.Length > 0)
        {
            plot.Title(title, TitleFontPx);
            plot.Axes.Title.Label.FontName = FontRegistry.Family;
            plot.Axes.Title.Label.Bold = true;
        }
        ConfigureAxis((ScottPlot.AxisPanels.AxisBase)plot.Axes.Bottom, ps.X, ps.XAxisLabelled, pp.XTicks);
        ConfigureAxis((ScottPlot.AxisPanels.AxisBase)plot.Axes.Left, ps.Y, ps.YAxisLabelled, pp.YTicks);

        int drawn = 0, dropped = 0;
        foreach (var s in ps.Series)
        {
            var (ok, lost) = AddSeries(plot, ps, s, pp);
            if (ok) drawn++;
            dropped += lost;
        }

        if (ps.Note.Length > 0)
        {
            var note = plot.Add.Annotation(ps.Note, Alignment.UpperLeft);
            note.LabelFontName = FontRegistry.Family;
            note.LabelFontSize = TickFontPx;
            note.LabelBackgroundColor = Colors.White.WithAlpha(0.8);
            note.LabelBorderColor = Colors.Transparent;
            note.LabelShadowColor = Colors.Transparent;
        }

        if (ps.Legend is not (LegendPlace.None or LegendPlace.Below) && ps.Series.Any(s => s.Label.Length > 0))
        {
            plot.ShowLegend(ps.Legend switch
            {
                LegendPlace.UpperLeft => Alignment.UpperLeft,
                LegendPlace.LowerLeft => Alignment.LowerLeft,
                LegendPlace.LowerRight => Alignment.LowerRight,
                _ => Alignment.UpperRight,
            });
            plot.Legend.FontName = FontRegistry.Family;
            plot.Legend.FontSize = LegendFontPx;
            plot.Legend.SetBestFontOnEachRender = false;
            plot.Legend.BackgroundColor = Colors.White.WithAlpha(0.85);
            plot.Legend.OutlineColor = Color.FromHex("#BBBBBB");
            plot.Legend.ShadowColor = Colors.Transparent;
            plot.Legend.SymbolWidth = 30;
        }
        else plot.HideLegend();

        plot.Axes.SetLimitsX(pp.XMin, pp.XMax);
        if (ps.Y.Inverted) plot.Axes.SetLimitsY(pp.YMax, pp.YMin);
        else plot.Axes.SetLimitsY(pp.YMin, pp.YMax);

        plot.Render(canvas, cell);

        var dr = plot.LastRender.DataRect;
        var xl = plot.Axes.GetLimits();
        double xa = Math.Min(xl.Left, xl.Right), xb = Math.Max(xl.Left, xl.Right);
        double ya = Math.Min(xl.Bottom, xl.Top), yb = Math.Max(xl.Bottom, xl.Top);
        return new RenderedPanel(
            new SKRect(dr.Left, dr.Top, dr.Right, dr.Bottom),
            ps.X.Log ? Math.Pow(10, xa) : xa, ps.X.Log ? Math.Pow(10, xb) : xb,
            ps.Y.Log ? Math.Pow(10, ya) : ya, ps.Y.Log ? Math.Pow(10, yb) : yb,
            drawn, dropped);
    }

    private static void ConfigureAxis(ScottPlot.AxisPanels.AxisBase axis, AxisSpec spec, bool labelled, IReadOnlyList<AxisTick>? ticks)
    {
        axis.LabelText = labelled ? spec.Title : "";
        axis.LabelFontName = FontRegistry.Family;
        axis.LabelFontSize = AxisFontPx;
        axis.LabelBold = false;
        axis.TickLabelStyle.FontName = FontRegistry.Family;
        axis.TickLabelStyle.FontSize = TickFontPx;
        axis.TickLabelStyle.IsVisible = labelled;
        axis.MajorTickStyle.Length = 5;
        axis.MinorTickStyle.Length = 2.5f;
        if (ticks is not null)
        {
            var gen = new ScottPlot.TickGenerators.NumericManual();
            foreach (var t in ticks)
            {
                if (t.Major) gen.AddMajor(t.Position, labelled ? t.Label : "");
                else gen.AddMinor(t.Position);
            }
            axis.TickGenerator = gen;
        }
        else
        {
            axis.TickGenerator = new ScottPlot.TickGenerators.NumericAutomatic
            {
                LabelFormatter = v => labelled ? FormatLinear(v) : "",
                TargetTickCount = 6,
                IntegerTicksOnly = spec.IntegerTicks,
            };
        }
    }

    internal static string FormatLinear(double v)
    {
        if (Math.Abs(v) < 1e-12) return "0";
        double a = Math.Abs(v);
        var s = a >= 1e5 || a < 1e-3 ? v.ToString("0.##E+0", CultureInfo.InvariantCulture) : v.ToString("0.######", CultureInfo.InvariantCulture);
        return s.Replace('-', '−');
    }

    private static Color C(SeriesSpec s, double alphaScale = 1.0) => Color.FromHex(s.Color).WithAlpha(Math.Clamp(s.Alpha * alphaScale, 0, 1));

    private static LinePattern Pattern(DashKind d) => d switch
    {
        DashKind.Dashed => LinePattern.Dashed,
        DashKind.Dotted => LinePattern.Dotted,
        DashKind.DashDot => new LinePattern([8f, 3f, 2f, 3f], 0f, "dash-dot"),
        _ => LinePattern.Solid,
    };

    private static MarkerShape Shape(MarkerKind m) => m switch
    {
        MarkerKind.OpenCircle => MarkerShape.OpenCircle,
        MarkerKind.Square => MarkerShape.FilledSquare,
        MarkerKind.Diamond => MarkerShape.FilledDiamond,
        MarkerKind.Triangle => MarkerShape.FilledTriangleUp,
        _ => MarkerShape.FilledCircle,
    };

    private static float Px(double points) => (float)(points * LogicalDpi / 72.0);

    /// <summary>Adds one series; returns whether anything was drawn and how many points a log axis dropped.</summary>
    private static (bool Drawn, int Dropped) AddSeries(Plot plot, PanelSpec ps, SeriesSpec s, PreparedPanel pp)
    {
        AxisSpec ax = ps.X, ay = ps.Y;
        switch (s)
        {
            case PointSeries p:
            {
                var xs = new List<double>(); var ys = new List<double>();
                var xn = new List<double>(); var xp = new List<double>(); var yn = new List<double>(); var yp = new List<double>();
                int lost = 0;
                for (int i = 0; i < p.X.Count; i++)
                {
                    double x = T(ax, p.X[i]), y = T(ay, p.Y[i]);
                    if (!double.IsFinite(x) || !double.IsFinite(y)) { lost++; continue; }
                    xs.Add(x); ys.Add(y);
                    xn.Add(ErrLen(ax, p.X[i], p.XErrLow?[i], -1, pp.XMin));
                    xp.Add(ErrLen(ax, p.X[i], p.XErrHigh?[i], +1, pp.XMax));
                    yn.Add(ErrLen(ay, p.Y[i], p.YErrLow?[i], -1, Math.Min(pp.YMin, pp.YMax)));
                    yp.Add(ErrLen(ay, p.Y[i], p.YErrHigh?[i], +1, Math.Max(pp.YMin, pp.YMax)));
                }
                if (xs.Count == 0) return (false, lost);
                bool anyErr = p.XErrLow is not null || p.XErrHigh is not null || p.YErrLow is not null || p.YErrHigh is not null;
                if (anyErr)
                {
                    // Few points (intervals, summaries): bold bars with caps; many points: light thin bars.
                    bool few = xs.Count <= 50;
                    var eb = new ScottPlot.Plottables.ErrorBar(xs, ys, xp, xn, yp, yn) // ScottPlot 5.1 takes the positive side first (checked on a rendered asymmetric bin)
                    {
                        LineColor = few ? C(p) : C(p, 0.6), LineWidth = few ? 1.6f : 0.8f, CapSize = few ? 5 : 0, LegendText = "",
                    };
                    plot.Add.Plottable(eb);
                }
                var sc = plot.Add.ScatterPoints(xs.ToArray(), ys.ToArray());
                sc.MarkerShape = Shape(p.Marker);
                sc.MarkerSize = Px(p.MarkerSize);
                sc.MarkerFillColor = C(p);
                sc.MarkerLineColor = C(p);
                sc.MarkerLineWidth = p.Marker == MarkerKind.OpenCircle ? 1f : 0.5f;
                sc.LegendText = p.Label;
                return (true, lost);
            }
            case LineSeries l:
            {
                var (xs, ys, lost) = Transform(ax, ay, l.X, l.Y);
                if (xs.Length < 2) return (false, lost);
                var sc = plot.Add.ScatterLine(xs, ys);
                sc.LineColor = C(l);
                sc.LineWidth = Px(l.Width);
                sc.LinePattern = Pattern(l.Dash);
                sc.MarkerSize = 0;
                sc.LegendText = l.Label;
                return (true, lost);
            }
            case BandSeries b:
            {
                var xs = new List<double>(); var lo = new List<double>(); var hi = new List<double>();
                int lost = 0;
                for (int i = 0; i < b.X.Count; i++)
                {
                    double x = T(ax, b.X[i]), y0 = T(ay, b.Low[i]), y1 = T(ay, b.High[i]);
                    if (!double.IsFinite(x) || !double.IsFinite(y0) || !double.IsFinite(y1)) { lost++; continue; }
                    xs.Add(x); lo.Add(y0); hi.Add(y1);
                }
                if (xs.Count < 2) return (false, lost);
                var f = plot.Add.FillY(xs.ToArray(), lo.ToArray(), hi.ToArray());
                f.FillColor = C(b, 1.0);
                f.LineWidth = 0;
                f.MarkerSize = 0;
                f.LegendText = b.Label;
                return (true, lost);
            }
            case BinnedSeries bs:
            {
                var xs = new List<double>(); var ys = new List<double>();
                var xn = new List<double>(); var xp = new List<double>(); var yn = new List<double>(); var yp = new List<double>();
                int lost = 0;
                for (int i = 0; i < bs.Y.Count; i++)
                {
                    double a = T(ax, bs.XLow[i]), c = T(ax, bs.XHigh[i]), y = T(ay, bs.Y[i]);
                    double ylo = T(ay, bs.YLow[i]), yhi = T(ay, bs.YHigh[i]);
                    if (!double.IsFinite(a) || !double.IsFinite(c) || !double.IsFinite(y)) { lost++; continue; }
                    double xm = bs.XCentre is { } xc && i < xc.Count && double.IsFinite(T(ax, xc[i])) ? T(ax, xc[i]) : 0.5 * (a + c);
                    xs.Add(xm); ys.Add(y); xn.Add(xm - a); xp.Add(c - xm);
                    yn.Add(double.IsFinite(ylo) ? Math.Max(0, y - ylo) : 0);
                    yp.Add(double.IsFinite(yhi) ? Math.Max(0, yhi - y) : 0);
                }
                if (xs.Count == 0) return (false, lost);
                var eb = new ScottPlot.Plottables.ErrorBar(xs, ys, xp, xn, yp, yn) // ScottPlot 5.1 takes the positive side first (checked on a rendered asymmetric bin)
                {
                    LineColor = C(bs), LineWidth = 1.4f, CapSize = 4, LegendText = "",
                };
                plot.Add.Plottable(eb);
                var sc = plot.Add.ScatterPoints(xs.ToArray(), ys.ToArray());
                sc.MarkerShape = Shape(bs.Marker);
                sc.MarkerSize = Px(bs.MarkerSize);
                sc.MarkerFillColor = C(bs);
                sc.MarkerLineColor = Colors.White;
                sc.MarkerLineWidth = 0.8f;
                sc.LegendText = bs.Label;
                return (true, lost);
            }
            case HistogramSeries hs:
            {
                if (hs.Heights.Count == 0) return (false, 0);
                var xs = new List<double>(); var ys = new List<double>();
                for (int i = 0; i < hs.Heights.Count; i++)
                {
                    double a = T(ax, hs.Edges[i]), c = T(ax, hs.Edges[i + 1]), y = T(ay, hs.Heights[i]);
                    if (!double.IsFinite(y)) y = Math.Min(pp.YMin, pp.YMax);
                    xs.Add(a); ys.Add(y); xs.Add(c); ys.Add(y);
                }
                double baseY = ay.Log ? Math.Min(pp.YMin, pp.YMax) : 0.0;
                if (hs.Filled)
                {
                    var f = plot.Add.FillY(xs.ToArray(), xs.Select(_ => baseY).ToArray(), ys.ToArray());
                    f.FillColor = C(hs, 0.35);
                    f.LineWidth = 0;
                    f.MarkerSize = 0;
                    f.LegendText = "";
                }
                var outline = new List<double> { xs[0] }; var oy = new List<double> { baseY };
                outline.AddRange(xs); oy.AddRange(ys);
                outline.Add(xs[^1]); oy.Add(baseY);
                var sc = plot.Add.ScatterLine(outline.ToArray(), oy.ToArray());
                sc.LineColor = C(hs);
                sc.LineWidth = 1.2f;
                sc.MarkerSize = 0;
                sc.LegendText = hs.Label;
                return (true, 0);
            }
            case BarSeries br:
            {
                if (br.Values.Count == 0) return (false, 0);
                var bars = br.Values.Select((v, i) => new Bar
                {
                    Position = i + br.Offset,
                    Value = v,
                    ValueBase = 0,
                    Size = br.Thickness,
                    FillColor = C(br),
                    LineWidth = 0,
                    Orientation = br.Horizontal ? Orientation.Horizontal : Orientation.Vertical,
                }).ToList();
                var bp = plot.Add.Bars(bars);
                bp.Horizontal = br.Horizontal;
                bp.LegendText = br.Label;
                return (true, 0);
            }
            case DensitySeries d:
            {
                int nx = d.Counts.GetLength(0), ny = d.Counts.GetLength(1);
                double max = 0;
                foreach (var c in d.Counts) max = Math.Max(max, c);
                if (max <= 0) return (false, 0);
                var lowC = Color.FromHex(Palette.DensityLow); var highC = Color.FromHex(Palette.DensityHigh);
                bool first = true;
                for (int i = 0; i < nx; i++)
                for (int j = 0; j < ny; j++)
                {
                    double c = d.Counts[i, j];
                    if (c <= 0) continue;
                    double x0 = T(ax, d.XEdges[i]), x1 = T(ax, d.XEdges[i + 1]), y0 = T(ay, d.YEdges[j]), y1 = T(ay, d.YEdges[j + 1]);
                    if (!double.IsFinite(x0 + x1 + y0 + y1)) continue;
                    double f = 0.15 + 0.85 * Math.Sqrt(c / max);
                    var rect = plot.Add.Rectangle(x0, x1, y0, y1);
                    rect.FillColor = Lerp(lowC, highC, f).WithAlpha(d.Alpha);
                    rect.LineWidth = 0;
                    rect.LegendText = first ? d.Label : "";
                    first = false;
                }
                return (true, 0);
            }
            case LegendKey k:
            {
                // Two points far outside the limits: clipped away, but the legend shows the style.
                double fx = pp.XMax + 10 * (pp.XMax - pp.XMin), fy = Math.Max(pp.YMax, pp.YMin) + 10 * Math.Abs(pp.YMax - pp.YMin);
                var sc = plot.Add.ScatterLine(new[] { fx, fx + 1 }, new[] { fy, fy + 1 });
                sc.LineColor = C(k);
                sc.LineWidth = 1.3f;
                sc.LinePattern = Pattern(k.Dash);
                sc.MarkerSize = 0;
                sc.LegendText = k.Label;
                return (true, 0);
            }
            case ReferenceLine r:
            {
                double v = T(r.Vertical ? ax : ay, r.Value);
                if (!double.IsFinite(v)) return (false, 1);
                if (r.Vertical)
                {
                    var vl = plot.Add.VerticalLine(v, 1.2f, C(r), Pattern(r.Dash));
                    vl.LegendText = r.Label;
                }
                else
                {
                    var hl = plot.Add.HorizontalLine(v, 1.2f, C(r), Pattern(r.Dash));
                    hl.LegendText = r.Label;
                }
                return (true, 0);
            }
            default:
                throw new NotSupportedException($"series kind {s.GetType().Name} has no renderer");
        }
    }

    private static Color Lerp(Color a, Color b, double f) => new(
        (byte)Math.Round(a.Red + (b.Red - a.Red) * f),
        (byte)Math.Round(a.Green + (b.Green - a.Green) * f),
        (byte)Math.Round(a.Blue + (b.Blue - a.Blue) * f));

    /// <summary>Error-bar length in drawn coordinates; on a log axis a bar reaching ≤ 0 is cut at the axis edge.</summary>
    private static double ErrLen(AxisSpec axis, double v, double? err, int sign, double edge)
    {
        if (err is not { } e || !(e > 0)) return 0;
        double tv = T(axis, v), te = T(axis, v + sign * e);
        if (!double.IsFinite(te)) return Math.Abs(tv - edge);
        return Math.Abs(te - tv);
    }

    private static (double[] Xs, double[] Ys, int Lost) Transform(AxisSpec ax, AxisSpec ay, IReadOnlyList<double> x, IReadOnlyList<double> y)
    {
        var xs = new List<double>(x.Count); var ys = new List<double>(x.Count);
        int lost = 0;
        for (int i = 0; i < x.Count; i++)
        {
            double a = T(ax, x[i]), b = T(ay, y[i]);
            if (!double.IsFinite(a) || !double.IsFinite(b)) { lost++; continue; }
            xs.Add(a); ys.Add(b);
        }
        return (xs.ToArray(), ys.ToArray(), lost);
    }

    /// <summary>
    /// Skia numbers clip paths from a process-wide counter; renumber them per figure
    /// ("ID-c1", "ID-c2", …) so the SVG is the same on every run and several figures can be
    /// inlined in one HTML page without clashing ids.
    /// </summary>
    private static string RenumberIds(string svg, string prefix)
    {
        var map = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (System.Text.RegularExpressions.Match m in System.Text.RegularExpressions.Regex.Matches(svg, "id=\"([^\"]+)\""))
            if (!map.ContainsKey(m.Groups[1].Value)) map[m.Groups[1].Value] = $"{prefix}-c{map.Count + 1}";
        if (map.Count == 0) return svg;
        return System.Text.RegularExpressions.Regex.Replace(svg, "(id=\"|url\\(#|href=\"#)([^\"\\)]+)", m =>
            map.TryGetValue(m.Groups[2].Value, out var n) ? m.Groups[1].Value + n : m.Value);
    }

    private static string AddViewBox(string svg, float w, float h)
    {
        int i = svg.IndexOf("<svg", StringComparison.Ordinal);
        if (i < 0 || svg.IndexOf("viewBox", StringComparison.Ordinal) >= 0) return svg;
        string vb = string.Create(CultureInfo.InvariantCulture, $" viewBox=\"0 0 {w:0.##} {h:0.##}\"");
        return svg.Insert(i + 4, vb);
    }

    /// <summary>The typeface the plotting library hands out for a family name (tests check it is always the embedded one).</summary>
    internal static SKTypeface ResolveTypeface(string family, bool bold)
    {
        EnsureFonts();
        return Fonts.GetTypeface(family, bold, false);
    }

    /// <summary>Registers the embedded fonts with the plotting library once per process.</summary>
    private static void EnsureFonts()
    {
        if (fontsRegistered) return;
        lock (FontLock)
        {
            if (fontsRegistered) return;
            Fonts.FontResolvers.Insert(0, new EmbeddedFontResolver());
            Fonts.Default = FontRegistry.Family;
            Fonts.Sans = FontRegistry.Family;
            fontsRegistered = true;
        }
    }

    /// <summary>Answers every font request with the embedded DejaVu Sans (bold when asked).</summary>
    private sealed class EmbeddedFontResolver : IFontResolver
    {
        public SKTypeface? CreateTypeface(string fontName, FontWeight weight, FontSlant slant, FontSpacing spacing) =>
            weight >= FontWeight.SemiBold ? FontRegistry.Bold : FontRegistry.Regular;

        public SKTypeface? CreateTypeface(string fontName, bool bold, bool italic) =>
            bold ? FontRegistry.Bold : FontRegistry.Regular;
    }
}

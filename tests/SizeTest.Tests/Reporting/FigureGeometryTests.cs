using SizeTest.Reporting.Data;
using SizeTest.Reporting.Figures;
using SizeTest.Reporting.Rendering;
using SkiaSharp;
using Xunit;

namespace SizeTest.Tests.Reporting;

/// <summary>
/// Geometry and pixel checks on rendered figures: legends cover no data, binned points sit at their bins' median
/// redshift, a model keeps its colour whatever its rank, corner-plot tick labels never overlap, count axes have
/// whole-number ticks and guides stay inside the axes.
/// </summary>
public sealed class FigureGeometryTests
{
    private static FigureSpec Figure(ReportData data, string id) => ReportFigures.Build(data).Single(f => f.Id == id);

    /// <summary>Pixel x of data value <paramref name="v"/> on a panel with a log (or linear) x axis.</summary>
    private static float PixelX(RenderedPanel p, double v, bool log) => log
        ? p.DataRect.Left + (float)((Math.Log10(v) - Math.Log10(p.XMin)) / (Math.Log10(p.XMax) - Math.Log10(p.XMin))) * p.DataRect.Width
        : p.DataRect.Left + (float)((v - p.XMin) / (p.XMax - p.XMin)) * p.DataRect.Width;

    private static float PixelY(RenderedPanel p, double v, bool log) => log
        ? p.DataRect.Bottom - (float)((Math.Log10(v) - Math.Log10(p.YMin)) / (Math.Log10(p.YMax) - Math.Log10(p.YMin))) * p.DataRect.Height
        : p.DataRect.Bottom - (float)((v - p.YMin) / (p.YMax - p.YMin)) * p.DataRect.Height;

    [Fact]
    public void LegendBoxOverlapsNoDataPoint()
    {
        var data = SyntheticReport.Create(n: 300);
        foreach (var id in new[] { AngularSizeFigure.Id, SurfaceBrightnessFigure.Id, CriteriaFigure.Id })
        {
            var spec = Figure(data, id);
            var png = FigureRenderer.RenderPng(spec, 96);
            var legend = png.Layout.LegendRect;
            Assert.False(legend.IsEmpty, $"{id}: legend drawn");
            foreach (var panel in png.Layout.Panels) Assert.False(legend.IntersectsWith(panel.DataRect), $"{id}: legend overlaps a data area");
        }
        // And point by point on the angular-size panel: no object's pixel falls inside the legend box.
        var a = FigureRenderer.RenderPng(Figure(data, AngularSizeFigure.Id), 96).Layout;
        var main = a.Panels[0];
        for (int i = 0; i < data.Objects.Count; i++)
        {
            float x = PixelX(main, data.Objects.Z[i], true), y = PixelY(main, data.Objects.ThetaArcsec![i], true);
            Assert.False(a.LegendRect.Contains(x, y), $"object {i} at ({x}, {y}) lies under the legend");
        }
    }

    [Fact]
    public void BinnedPointsAreDrawnAtTheirBinsMedianRedshift()
    {
        // Four groups of 100 objects, 90 piled at the low end of each group and 10 spread above it: the median of each
        // equal-count bin sits far from the bin centre, so a point drawn at the centre would be many pixels off. The
        // pixel column of each black marker must be the median's.
        double[] starts = [0.1, 0.3, 0.8, 1.6], ends = [0.29, 0.79, 1.59, 3.0];
        var z = Enumerable.Range(0, 400).Select(i => { int g = i / 100, k = i % 100; return k < 90 ? starts[g] * (1 + 0.001 * k / 90) : starts[g] + (ends[g] - starts[g]) * (k - 89) / 10.0; }).ToArray();
        var theta = z.Select(v => SyntheticReport.ThetaLcdm(v, -1)).ToArray();
        var data = new ReportData
        {
            Job = SyntheticReport.Create(n: 10).Job, Data = SyntheticReport.Create(n: 10).Data,
            Objects = new ObjectPoints(z) { ThetaArcsec = theta }, Models = [], Assumptions = [],
        }.WithBins(4, 20, 1);
        var bins = data.ThetaBins!;
        var spec = Figure(data, AngularSizeFigure.Id);
        spec = spec with { Panels = [spec.Panels[0] with { Series = spec.Panels[0].Series.OfType<BinnedSeries>().ToList<SeriesSpec>() }], RowHeights = [1.0] };
        var png = FigureRenderer.RenderPng(spec, 96);
        using var bmp = SKBitmap.Decode(png.Bytes);
        var panel = png.Layout.Panels[0];
        foreach (var b in bins)
        {
            Assert.True(Math.Abs(Math.Log(b.ZMedian / Math.Sqrt(b.ZLow * b.ZHigh))) > 0.03, "precondition: median away from the (log-axis) bin centre");
            float x = PixelX(panel, b.ZMedian, true), y = PixelY(panel, b.Value, true);
            // The marker (6 pt ≈ 8 px square) is black: its dark pixels centre on (x, y) within 1.5 px.
            double sx = 0, n = 0;
            for (int px = (int)x - 8; px <= (int)x + 8; px++)
                for (int py = (int)y - 3; py <= (int)y + 3; py++)
                {
                    var c = bmp.GetPixel(px, py);
                    if (c.Red < 60 && c.Green < 60 && c.Blue < 60) { sx += px; n++; }
                }
            Assert.True(n > 10, $"marker found near bin {b.ZLow}–{b.ZHigh}");
            Assert.InRange(sx / n, x - 1.5, x + 1.5);
        }
    }

    [Fact]
    public void AModelKeepsItsColourWhenItsRankChanges()
    {
        var data = SyntheticReport.Create(n: 200);
        var reversed = data with { Models = data.Models.Reverse().ToList() };
        string Colour(ReportData d, string label) => Figure(d, AngularSizeFigure.Id).Panels[0].Series.OfType<LineSeries>().First(s => s.Label.StartsWith(label, StringComparison.Ordinal)).Color;
        foreach (var m in data.Models)
        {
            Assert.Equal(Colour(data, m.Label), Colour(reversed, m.Label));
            Assert.Equal(ModelStyles.Color(m.Fit.Name), Colour(data, m.Label));
        }
        // And on the rendered page: the ΛCDM colour is present in both renderings.
        var c = SKColor.Parse(ModelStyles.Color("lcdm"));
        foreach (var d in new[] { data, reversed })
        {
            using var bmp = SKBitmap.Decode(FigureRenderer.RenderPng(Figure(d, AngularSizeFigure.Id), 96).Bytes);
            int hits = 0;
            for (int x = 0; x < bmp.Width; x++)
                for (int y = 0; y < bmp.Height; y++)
                {
                    var p = bmp.GetPixel(x, y);
                    if (Math.Abs(p.Red - c.Red) < 12 && Math.Abs(p.Green - c.Green) < 12 && Math.Abs(p.Blue - c.Blue) < 12) hits++;
                }
            Assert.True(hits > 50, $"ΛCDM's colour drawn ({hits} pixels)");
        }
    }

    [Fact]
    public void CornerTickLabelsNeverOverlap()
    {
        // Six parameters with very different ranges; every pair of neighbouring x tick labels (inside a panel and
        // across adjacent panels of the bottom row) must be apart. Label boxes are measured with the figure's font.
        var rng = new Random(3);
        var rows = Enumerable.Range(0, 2000).Select(_ => new[] { 70 + rng.NextDouble(), 0.3 + 0.01 * rng.NextDouble(), -1 + 0.1 * rng.NextDouble(),
            1234 + 50 * rng.NextDouble(), 1e-3 * rng.NextDouble(), 21 + rng.NextDouble() }).ToList();
        var post = new CornerDraws("lcdm", ["h0", "omega_m", "size_evolution", "big", "tiny", "mu0"], Enumerable.Repeat(AxisSpec.Dimensionless, 6).ToList(), rows);
        var data = SyntheticReport.Create(n: 50) with { Posterior = post };
        var spec = Figure(data, CornerFigure.Id);
        Assert.Equal(6 * 7 / 2, spec.Panels.Count); // every parameter is shown
        using var font = new SKFont(FontRegistry.Regular, 11f);
        var layout = FigureRenderer.RenderPng(spec, 96).Layout;
        var boxes = new List<SKRect>();
        for (int i = 0; i < spec.Panels.Count; i++)
        {
            var ps = spec.Panels[i];
            if (!ps.XAxisLabelled) continue;
            var rp = layout.Panels[i];
            foreach (var t in FigureRenderer.InnerTicks(rp.XMin, rp.XMax))
            {
                float x = PixelX(rp, t.Position, false), w = font.MeasureText(t.Label);
                boxes.Add(new SKRect(x - w / 2, rp.DataRect.Bottom, x + w / 2, rp.DataRect.Bottom + 12));
            }
        }
        boxes = boxes.OrderBy(b => b.Left).ToList();
        for (int i = 1; i < boxes.Count; i++) Assert.True(boxes[i].Left > boxes[i - 1].Right + 2, $"tick labels {i - 1} and {i} overlap");
    }

    [Fact]
    public void CountAxesHaveIntegerTicksAndGuidesStayInsideTheAxes()
    {
        var data = SyntheticReport.Create(n: 100);
        var rej = data with { Data = data.Data with { RejectReasons = [new RejectReasonCount("missing z", 2), new RejectReasonCount("negative theta", 1)] } };
        Assert.True(Figure(rej, RejectsFigure.Id).Panels[0].X.IntegerTicks);
        var crit = Figure(data, CriteriaFigure.Id);
        double max = crit.Panels[0].X.Max!.Value;
        Assert.All(crit.Panels[0].Series.OfType<ReferenceLine>(), r => Assert.InRange(r.Value, 0, max));
        var label = crit.Panels[0].Series.OfType<ReferenceLine>().FirstOrDefault()?.Label ?? "";
        if (max < 10) Assert.DoesNotContain("10", label);
    }
}

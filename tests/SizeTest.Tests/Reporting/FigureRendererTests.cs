using System.Xml.Linq;
using SizeTest.Reporting.Figures;
using SizeTest.Reporting.Rendering;
using SkiaSharp;
using Xunit;

namespace SizeTest.Tests.Reporting;

public sealed class FigureRendererTests
{
    private static readonly Lazy<IReadOnlyList<FigureSpec>> Figures = new(() => ReportFigures.Build(SyntheticReport.Create()));
    private static readonly Lazy<IReadOnlyList<FigureSpec>> DenseFigures = new(() => ReportFigures.Build(SyntheticReport.Create(4000, seed: 11, posterior: false, power: false)));

    public static TheoryData<string> FigureIds() => new(Figures.Value.Select(f => f.Id));

    private static FigureSpec Get(string id) => Figures.Value.Single(f => f.Id == id);

    [Fact]
    public void SyntheticDataProduceAllEightFigures()
    {
        // The fixture has sizes, SB, evolution terms, binned evolution, criteria, posterior, power and rejects, so every builder applies.
        Assert.Equal(["angular-size", "surface-brightness", "required-evolution", "binned-evolution", "model-comparison", "posterior-corner", "power", "rejects"],
            Figures.Value.Select(f => f.Id));
    }

    [Theory]
    [MemberData(nameof(FigureIds))]
    public void EveryFigureHasVisibleTextInItsLabelAreas(string id)
    {
        var spec = Get(id);
        var png = FigureRenderer.RenderPng(spec, 100);
        using var bmp = SKBitmap.Decode(png.Bytes);
        float k = png.Scale;
        // Title band: full width above the first row of panels.
        var top = png.Layout.Panels[0].DataRect;
        Assert.True(PixelCheck.DarkPixels(bmp, new SKRectI(0, 0, bmp.Width, (int)((top.Top - 4) * k))) > 20, "figure title is blank");
        for (int i = 0; i < spec.Panels.Count; i++)
        {
            var ps = spec.Panels[i];
            var r = png.Layout.Panels[i].DataRect;
            if (ps.XAxisLabelled)
            {
                // Below the data area, past the tick marks (8 logical px): tick labels and the axis title.
                var band = new SKRectI((int)(r.Left * k), (int)((r.Bottom + 8) * k), (int)(r.Right * k), (int)((r.Bottom + 46) * k));
                Assert.True(PixelCheck.DarkPixels(bmp, band) > 40, $"x-axis text of panel {i} is blank");
            }
            if (ps.YAxisLabelled)
            {
                var band = new SKRectI(0, (int)(r.Top * k), (int)((r.Left - 8) * k), (int)(r.Bottom * k));
                Assert.True(PixelCheck.DarkPixels(bmp, band) > 40, $"y-axis text of panel {i} is blank");
            }
        }
    }

    [Fact]
    public void PixelCheckFindsNothingWhenAFigureHasNoText()
    {
        // Negative control for the text check: the same panel with titles and tick labels switched off.
        var spec = Get("power");
        var bare = spec with { Title = "", Panels = spec.Panels.Select(p => p with { XAxisLabelled = false, YAxisLabelled = false, Legend = LegendPlace.None }).ToList() };
        var png = FigureRenderer.RenderPng(bare, 100);
        using var bmp = SKBitmap.Decode(png.Bytes);
        var r = png.Layout.Panels[0].DataRect;
        float k = png.Scale;
        Assert.Equal(0, PixelCheck.DarkPixels(bmp, new SKRectI(0, (int)((r.Bottom + 8) * k), bmp.Width, bmp.Height)));
        Assert.Equal(0, PixelCheck.DarkPixels(bmp, new SKRectI(0, 0, bmp.Width, (int)((r.Top - 2) * k))));
    }

    [Theory]
    [MemberData(nameof(FigureIds))]
    public void EveryDeclaredSeriesIsDrawnAndEveryAxisHasAUnit(string id)
    {
        var spec = Get(id);
        var layout = FigureRenderer.RenderPng(spec, 50).Layout;
        Assert.Equal(spec.Panels.Count, layout.Panels.Count);
        for (int i = 0; i < spec.Panels.Count; i++)
        {
            Assert.Equal(spec.Panels[i].Series.Count, layout.Panels[i].SeriesDrawn);
            Assert.False(string.IsNullOrWhiteSpace(spec.Panels[i].X.Unit), $"panel {i} x axis has no unit");
            Assert.False(string.IsNullOrWhiteSpace(spec.Panels[i].Y.Unit), $"panel {i} y axis has no unit");
        }
    }

    [Fact]
    public void AngularSizeFigureHasDataBinsAndTwoCurvesPerModel()
    {
        var spec = Get("angular-size");
        var main = spec.Panels[0].Series;
        // 1 object series + 1 binned series + 3 models × (with, without evolution) + 1 legend key = 9 (fixture has 3 models).
        Assert.Equal(9, main.Count);
        Assert.Single(main.OfType<PointSeries>());
        Assert.Single(main.OfType<BinnedSeries>());
        Assert.Equal(6, main.OfType<LineSeries>().Count());
        Assert.True(spec.Panels[0].X.Log && spec.Panels[0].Y.Log);
        Assert.Equal(2, spec.Panels.Count); // residual panel
        Assert.Equal("residuals against ΛCDM", spec.Panels[1].Note);
    }

    [Fact]
    public void BinnedEvolutionFigureDrawsEachModelsBinsWithItsPowerLaw()
    {
        var spec = Get("binned-evolution");
        // One row per model with binned evolution (ΛCDM: one population, R0 and μ0 bins; static linear: two populations, R0
        // only): R0 on log–log axes of 1 + z and R0 on the left, μ0 against log (1 + z) on the right.
        Assert.Equal(3, spec.Panels.Count);
        Assert.Equal(2, spec.Columns);
        var lcdm = spec.Panels.Single(p => p.Row == 0 && p.Column == 0);
        var lcdmSb = spec.Panels.Single(p => p.Row == 0 && p.Column == 1);
        var stat = spec.Panels.Single(p => p.Row == 1 && p.Column == 0);
        Assert.All(new[] { lcdm, stat }, p => Assert.True(p.X.Log && p.Y.Log && p.Y.Unit == "kpc" && p.X.Label == "1 + z"));
        Assert.True(lcdmSb.X.Log && !lcdmSb.Y.Log && lcdmSb.Y.Unit == "mag/arcsec²");
        Assert.Single(lcdm.Series.OfType<BinnedSeries>());
        Assert.Equal(2, stat.Series.OfType<BinnedSeries>().Count());
        Assert.Equal(2, stat.Series.OfType<LineSeries>().Count());
        Assert.StartsWith("ΛCDM: a = -0.98", lcdm.Note);
        Assert.StartsWith("ΛCDM: b = 1.20", lcdmSb.Note);
        Assert.Contains("early: a = 0.35", stat.Note);
        Assert.Contains("left the physical size R0", spec.Caption);
        Assert.Contains("right the surface brightness μ0", spec.Caption);
        // Points sit at 1 + z_eff; the power-law line equals R0 (1+z)^a there (the fixture's unbent static model), and the μ0
        // line μ0 − 2.5 b log10(1+z) (the fixture's ΛCDM SB bins lie on it).
        AssertLineAtBins(stat, x => 3.2 * Math.Pow(x, 0.35)); // the closed form R0 (1+z)^a, absolute 1e-9 kpc
        AssertLineAtBins(lcdmSb, x => 19.5 - 2.5 * 1.2 * Math.Log10(x)); // μ0 − 2.5 b log10(1+z), absolute 1e-9 mag
        var sbBins = lcdmSb.Series.OfType<BinnedSeries>().Single();
        for (int k = 0; k < sbBins.Y.Count; k++) Assert.Equal(19.5 - 3.0 * Math.Log10(sbBins.XCentre![k]), sbBins.Y[k], 1e-9);
    }

    private static void AssertLineAtBins(PanelSpec panel, Func<double, double> closedForm)
    {
        var bins = panel.Series.OfType<BinnedSeries>().First();
        var line = panel.Series.OfType<LineSeries>().First();
        for (int k = 0; k < bins.Y.Count; k++)
        {
            double x = bins.XCentre![k];
            int j = line.X.Select((v, i) => (Math.Abs(v - x), i)).Min().i;
            Assert.Equal(closedForm(line.X[j]), line.Y[j], 1e-9);
        }
    }

    [Fact]
    public void ManyObjectsAreDrawnAsADensity()
    {
        var spec = DenseFigures.Value.Single(f => f.Id == "angular-size");
        Assert.Single(spec.Panels[0].Series.OfType<DensitySeries>());
        Assert.Empty(spec.Panels[0].Series.OfType<PointSeries>());
        var d = spec.Panels[0].Series.OfType<DensitySeries>().Single();
        double total = 0;
        foreach (var c in d.Counts) total += c;
        Assert.Equal(4000, total); // every object lands in a cell (edges span the data range)
    }

    [Theory]
    [MemberData(nameof(FigureIds))]
    public void AxisLimitsContainAllData(string id)
    {
        var spec = Get(id);
        var layout = FigureRenderer.RenderPng(spec, 50).Layout;
        for (int i = 0; i < spec.Panels.Count; i++)
        {
            var p = spec.Panels[i];
            var r = layout.Panels[i];
            foreach (var s in p.Series)
            {
                // Data (objects, bins, densities) must lie inside; model curves may run past a fixed x range.
                if (p.X.Categories is null && s is PointSeries or BinnedSeries or DensitySeries)
                    foreach (var x in ((PointSeries?)(s as PointSeries))?.X ?? s.XExtent())
                        if (double.IsFinite(x) && (!p.X.Log || x > 0))
                            Assert.InRange(x, r.XMin * (1 - 1e-9), r.XMax * (1 + 1e-9));
                if (p.Y.Categories is null && s is PointSeries or LineSeries or BinnedSeries or BarSeries or HistogramSeries)
                    foreach (var y in ((PointSeries?)(s as PointSeries))?.Y ?? s.YExtent())
                        if (double.IsFinite(y) && (!p.Y.Log || y > 0))
                            Assert.InRange(y, Math.Min(r.YMin, r.YMax) - 1e-9 * Math.Abs(r.YMin), Math.Max(r.YMin, r.YMax) + 1e-9 * Math.Abs(r.YMax));
            }
        }
    }

    [Fact]
    public void PngIs300DpiAtTheFigureSize()
    {
        var spec = Get("power");
        var png = FigureRenderer.RenderPng(spec);
        // 6.4 in × 4.8 in of panels at 300 dpi = 1920 × 1440 pixels, plus the legend band drawn under them.
        Assert.Equal(1920, png.Width);
        Assert.Equal((int)Math.Round(FigureRenderer.LogicalSize(spec).Height * 300 / 96.0), png.Height);
        Assert.True(png.Height > 1440 && png.Layout.LegendRect.Top >= 4.8f * 96 - 0.5f);
        using var bmp = SKBitmap.Decode(png.Bytes);
        Assert.Equal(1920, bmp.Width);
    }

    [Fact]
    public void SvgIsWellFormedHasTheAxisTitlesAsTextAndIsTheSameEveryTime()
    {
        var spec = Get("surface-brightness");
        var svg = FigureRenderer.RenderSvg(spec);
        var doc = XDocument.Parse(svg);
        var texts = string.Concat(doc.Descendants().Where(e => e.Name.LocalName == "text").Select(e => e.Value));
        Assert.Contains("surface brightness μ (mag/arcsec²)", texts);
        Assert.Contains("1 + z", texts);
        Assert.Equal(svg, FigureRenderer.RenderSvg(spec)); // ids renumbered per figure, so byte-identical
        Assert.Contains("id=\"surface-brightness-c1\"", svg);
    }

    [ToolFact("pdftotext")]
    public void FigurePdfIsVectorWithExtractableText()
    {
        var spec = Get("angular-size");
        var pdf = FigureRenderer.RenderPdf(spec);
        var path = Path.Combine(Path.GetTempPath(), $"sizetest-fig-{Guid.NewGuid():N}.pdf");
        File.WriteAllBytes(path, pdf);
        try
        {
            var (exit, text, err) = ExternalTool.Run("pdftotext", [path, "-"]);
            Assert.True(exit == 0, err);
            Assert.Contains("angular size θ (arcsec)", text);
            Assert.Contains("redshift z", text);
            // No raster image: a vector page has no /Image XObject.
            Assert.DoesNotContain("/Subtype /Image", System.Text.Encoding.Latin1.GetString(pdf));
        }
        finally { File.Delete(path); }
    }
}

using System.Globalization;
using System.IO.Compression;
using System.Text;
using System.Text.RegularExpressions;
using SizeTest.Reporting;
using SizeTest.Reporting.Figures;
using SizeTest.Reporting.Pack;
using SizeTest.Reporting.Rendering;
using Xunit;

namespace SizeTest.Tests.Reporting;

public sealed partial class FigurePackTests
{
    private static ReportContent Make() => ReportContent.From(SyntheticReport.Create(seed: 7));

    [GeneratedRegex("<svg[^>]*\\swidth=\"([0-9.]+)")]
    private static partial Regex SvgWidth();

    [GeneratedRegex("/MediaBox\\s*\\[\\s*0\\s+0\\s+([0-9.]+)\\s+([0-9.]+)\\s*\\]")]
    private static partial Regex MediaBox();

    [Theory]
    [InlineData(3.3)] // single column, common practice
    [InlineData(7.0)] // double column, common practice
    public void RenderedFiguresHaveTheRequestedPrintedWidth(double inches)
    {
        var width = inches == 3.3 ? FigureWidth.SingleColumn : FigureWidth.DoubleColumn;
        foreach (var figure in Make().Figures)
        {
            var f = figure.AtWidth(width);
            // SVG user units are CSS pixels, 96 per inch (SVG 1.1 §7.10); a PDF point is 1/72 in (ISO 32000-1 §8.3.2.3).
            var svg = FigureRenderer.RenderSvg(f);
            double svgWidth = double.Parse(SvgWidth().Match(svg).Groups[1].Value, CultureInfo.InvariantCulture);
            Assert.Equal(inches * 96, svgWidth, 0.5); // within half a pixel (Skia writes the width as a float)
            var pdf = Encoding.Latin1.GetString(FigureRenderer.RenderPdf(f));
            var box = MediaBox().Match(pdf);
            Assert.True(box.Success, $"{f.Id}: no MediaBox");
            Assert.Equal(inches * 72, double.Parse(box.Groups[1].Value, CultureInfo.InvariantCulture), 0.5); // Skia writes the MediaBox in whole points: within half a point (1/144 in)
            Assert.Equal(FigureFonts.Journal, f.Fonts);
        }
    }

    [Fact]
    public void JournalWidthKeepsTheAspectRatioAndPrintSizeFonts()
    {
        var f = Make().Figures[0];
        var s = f.AtWidth(FigureWidth.SingleColumn);
        Assert.Equal(f.HeightInches / f.WidthInches, s.HeightInches / s.WidthInches, 1e-12); // aspect kept (closed form)
        // Common practice: lettering of 8–9 pt at the printed size.
        Assert.InRange(s.Fonts.TickPoints, 8, 9);
        Assert.InRange(s.Fonts.AxisPoints, 8, 9);
    }

    [Fact]
    public void VectorPdfFiguresEmbedTheirFonts()
    {
        // PDF 1.7, ISO 32000-1 §9.9: an embedded TrueType program is a /FontFile2 stream, a CFF/OpenType one /FontFile3.
        foreach (var f in Make().Figures)
        {
            var pdf = Encoding.Latin1.GetString(FigureRenderer.RenderPdf(f.AtWidth(FigureWidth.SingleColumn)));
            Assert.True(pdf.Contains("/FontFile2", StringComparison.Ordinal) || pdf.Contains("/FontFile3", StringComparison.Ordinal), $"{f.Id}.pdf embeds no font");
        }
    }

    [Fact]
    public void FiguresZipHoldsEveryFigureAndTableFileAtTheRequestedWidth()
    {
        var root = Directory.CreateTempSubdirectory("sizetest-figpack-");
        try
        {
            var target = Path.Combine(root.FullName, "out");
            var options = new ReportPackOptions { PngDpi = 60, PdfReport = false, Html = false, FigureWidth = FigureWidth.SingleColumn };
            var files = new ReportPackWriter(options).Write(target, false, Make());
            Assert.Contains(FigurePackZip.FileName, files);
            var onDisk = Directory.GetFiles(Path.Combine(target, "figures")).Select(p => "figures/" + Path.GetFileName(p))
                .Concat(Directory.GetFiles(Path.Combine(target, "tables")).Select(p => "tables/" + Path.GetFileName(p)))
                .Order(StringComparer.Ordinal).ToList();
            using var zip = ZipFile.OpenRead(Path.Combine(target, FigurePackZip.FileName));
            Assert.Equal(onDisk, zip.Entries.Select(e => e.FullName).ToList());
            foreach (var e in zip.Entries)
            {
                using var s = e.Open();
                using var copy = new MemoryStream();
                s.CopyTo(copy);
                Assert.Equal(File.ReadAllBytes(Path.Combine(target, e.FullName)), copy.ToArray());
            }
            Assert.Contains(zip.Entries, e => e.FullName.EndsWith(".png", StringComparison.Ordinal));
            Assert.Contains(zip.Entries, e => e.FullName.EndsWith(".svg", StringComparison.Ordinal));
            Assert.Contains(zip.Entries, e => e.FullName.EndsWith(".pdf", StringComparison.Ordinal));
            var svg = File.ReadAllText(Directory.GetFiles(Path.Combine(target, "figures"), "*.svg")[0]);
            Assert.Equal(3.3 * 96, double.Parse(SvgWidth().Match(svg).Groups[1].Value, CultureInfo.InvariantCulture), 0.5);
            Assert.Empty(Directory.GetDirectories(root.FullName, ".out.tmp-*"));
        }
        finally { root.Delete(true); }
    }

    [Fact]
    public void AnHtmlOnlyReportWritesNoFigurePack()
    {
        // formats = ["html"]: what was asked, the data files and the tables — no figures/ and no figures.zip.
        var root = Directory.CreateTempSubdirectory("sizetest-htmlonly-");
        try
        {
            var target = Path.Combine(root.FullName, "out");
            var options = new ReportPackOptions { Png = false, Svg = false, Pdf = false, PdfReport = false, Html = true };
            var files = new ReportPackWriter(options).Write(target, false, Make());
            Assert.Contains("report.html", files);
            Assert.DoesNotContain(FigurePackZip.FileName, files);
            Assert.False(File.Exists(Path.Combine(target, FigurePackZip.FileName)));
            Assert.DoesNotContain(files, f => f.StartsWith("figures/", StringComparison.Ordinal));
            Assert.DoesNotContain("report.pdf", files);
            Assert.Contains(files, f => f.StartsWith("tables/", StringComparison.Ordinal));
        }
        finally { root.Delete(true); }
    }
}

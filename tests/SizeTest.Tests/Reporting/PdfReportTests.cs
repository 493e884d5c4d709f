using SizeTest.Reporting;
using SizeTest.Reporting.Pdf;
using SkiaSharp;
using Xunit;

namespace SizeTest.Tests.Reporting;

public sealed class PdfReportTests
{
    private static readonly Lazy<ReportContent> Content = new(() => ReportContent.From(SyntheticReport.Create()));

    private static string Save(byte[] bytes, DirectoryInfo dir, string name = "report.pdf")
    {
        var p = Path.Combine(dir.FullName, name);
        File.WriteAllBytes(p, bytes);
        return p;
    }

    [ToolFact("pdffonts")]
    public void EmbedsOnlyDejaVuSans()
    {
        var report = new PdfReportWriter().Render(Content.Value);
        var dir = Directory.CreateTempSubdirectory("sizetest-pdffonts-");
        try
        {
            var path = Save(report.Bytes, dir);
            var lines = ExternalTool.Run("pdffonts", [path]).Stdout.Split('\n').Skip(2).Where(l => l.Trim().Length > 0).ToList();
            Assert.NotEmpty(lines);
            foreach (var l in lines)
            {
                Assert.Contains("DejaVuSans", l);
                Assert.Matches(@"\byes\b", l); // emb column
            }
        }
        finally { dir.Delete(true); }
    }

    [ToolFact("pdftotext", "pdfinfo")]
    public void HasTitleSummaryFiguresTablesAndManifestAsExtractableText()
    {
        var report = new PdfReportWriter().Render(Content.Value);
        var dir = Directory.CreateTempSubdirectory("sizetest-pdf-");
        try
        {
            var path = Save(report.Bytes, dir);
            var info = ExternalTool.Run("pdfinfo", [path]).Stdout;
            Assert.Equal(report.Pages.ToString(), System.Text.RegularExpressions.Regex.Match(info, @"Pages:\s+(\d+)").Groups[1].Value);
            // A4 = 595.28 × 841.89 pt; pdfinfo prints it rounded or not depending on the version.
            Assert.Matches(@"Page size:\s+59[56](\.\d+)? x 84[12](\.\d+)? pts \(A4\)", info);
            Assert.Equal("title", report.PageHeadings[0]);
            Assert.Equal("Summary", report.PageHeadings[1]);
            Assert.Contains("Figures", report.PageHeadings);
            Assert.Contains("Tables", report.PageHeadings);
            Assert.Equal("Run manifest", report.PageHeadings.Last(h => h != "continued"));

            var text = ExternalTool.Run("pdftotext", [path, "-"]).Stdout;
            Assert.Contains("Synthetic test study", text);
            Assert.Contains("Conclusions", text);
            Assert.Contains("Assumptions these conclusions rest on", text);
            Assert.Contains("do not say which model is true", text);
            Assert.Contains("rows read", text);
            for (int i = 1; i <= Content.Value.Figures.Count; i++) Assert.Contains($"Figure {i}.", text);
            Assert.Contains("converged", text); // comparison-table heading
            Assert.Contains("sha256", text);
            // Figure text is vector text too (axis title from inside a figure).
            Assert.Contains("angular size θ (arcsec)", text);
            // Page 1 text is the title page.
            var page1 = ExternalTool.Run("pdftotext", ["-f", "1", "-l", "1", path, "-"]).Stdout;
            Assert.Contains("SizeTest report", page1);
        }
        finally { dir.Delete(true); }
    }

    [ToolFact("pdftoppm", "pdfinfo")]
    public void PagesRenderWithPopplerAndLetterIsAnOption()
    {
        var report = new PdfReportWriter(PaperSize.Letter).Render(Content.Value);
        var dir = Directory.CreateTempSubdirectory("sizetest-pdfpages-");
        try
        {
            var path = Save(report.Bytes, dir);
            Assert.Matches(@"Page size:\s+612 x 792 pts \(letter\)", ExternalTool.Run("pdfinfo", [path]).Stdout);
            var (exit, _, err) = ExternalTool.Run("pdftoppm", ["-png", "-r", "40", path, Path.Combine(dir.FullName, "page")]);
            Assert.True(exit == 0, err);
            var pages = dir.GetFiles("page*.png").OrderBy(f => f.Name).ToList();
            Assert.Equal(report.Pages, pages.Count);
            foreach (var p in pages)
            {
                using var bmp = SKBitmap.Decode(File.ReadAllBytes(p.FullName));
                Assert.True(PixelCheck.NonWhite(bmp) > 20, $"{p.Name} is blank");
            }
        }
        finally { dir.Delete(true); }
    }

    [Fact]
    public void PaperSizesParse()
    {
        Assert.True(PaperSize.TryParse("Letter", out var l));
        Assert.Equal(612f, l.WidthPt); // 8.5 in × 72 pt/in
        Assert.True(PaperSize.TryParse("a4", out var a));
        Assert.Equal(595.2756f, a.WidthPt, 3); // 210 mm / 25.4 × 72
        Assert.False(PaperSize.TryParse("a5", out _));
    }
}

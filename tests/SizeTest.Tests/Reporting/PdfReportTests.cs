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

    [ToolFact("pdftotext")]
    public void NoNearlyEmptyPagesNoEscapedNewlinesAndParametersAtTheirPrecision()
    {
        var data = SyntheticReport.Create() with
        {
            Manifest = new SizeTest.Reporting.Pack.RunManifest
            {
                SizeTestVersion = "0.1.0", GitCommit = "0123456789abcdef0123456789abcdef01234567", Seed = 7, Command = "sizetest run study.toml",
                StudyFilePath = "study.toml", StudyFileText = "name = \"x\"\nseed = 7\n\n[models]\nnames = [\"lcdm\", \"eds\"]\n",
            },
        };
        var content = ReportContent.From(data);
        var report = new PdfReportWriter().Render(content);
        var dir = Directory.CreateTempSubdirectory("sizetest-pdf-");
        try
        {
            var path = Save(report.Bytes, dir);
            for (int page = 1; page <= report.Pages; page++)
            {
                var text = ExternalTool.Run("pdftotext", ["-f", page.ToString(), "-l", page.ToString(), path, "-"]).Stdout;
                int words = text.Split((char[])[' ', '\n', '\t'], StringSplitOptions.RemoveEmptyEntries).Length;
                bool figure = System.Text.RegularExpressions.Regex.IsMatch(text, @"Figure \d+\.");
                // A page of fewer than ~25 words is an orphan (an empty table header, a lone heading) unless it holds a figure.
                Assert.True(words >= 25 || figure, $"page {page} has {words} words and no figure: {text}");
            }
            var all = ExternalTool.Run("pdftotext", [path, "-"]).Stdout;
            Assert.DoesNotContain("\\n", all); // no escaped newline anywhere (the study file is printed as lines)
            Assert.Contains("[models]", all);
            Assert.Contains("0123456789abcdef0123456789abcdef01234567", all);
            Assert.Contains("sizetest run study.toml", all);
            // Every free parameter as the PDG rule rounds it (PdgRoundingTests pins the rule), never at six figures.
            foreach (var m in data.Models)
                foreach (var p in m.Fit.Parameters.Where(p => !p.Fixed && p.Hi > p.Lo))
                {
                    Assert.Contains(SizeTest.Foundation.Text.PdgRounding.ValueWithInterval(p.Value, p.Lo, p.Hi), all);
                    string six = p.Value.ToString("G6", System.Globalization.CultureInfo.InvariantCulture).Replace("-", "−");
                    if (six.Length > SizeTest.Foundation.Text.PdgRounding.ValueWithInterval(p.Value, p.Lo, p.Hi).Split(' ')[0].Length + 1)
                        Assert.DoesNotContain(six, all);
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

            var text = ExternalTool.Run("pdftotext", [path, "-"]).Stdout;
            Assert.Contains("Synthetic test study", text);
            Assert.Contains("Verdict", text);
            Assert.Contains("Provenance", text);
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

using System.Globalization;
using System.Text.RegularExpressions;
using SizeTest.Reporting;
using SizeTest.Reporting.Pdf;
using SizeTest.Reporting.Tables;
using Xunit;

namespace SizeTest.Tests.Reporting;

/// <summary>PDF page layout: wide tables wrap instead of shrinking, headings stay with what follows, prose has single spaces.</summary>
public sealed class PdfLayoutTests
{
    private static readonly Lazy<ReportContent> Content = new(() => ReportContent.From(SyntheticReport.Create()));

    private static string PdfToText(byte[] pdf, params string[] args) => ExternalTool.PdfText(pdf, args);

    [ToolFact("pdftotext")]
    public void AWideVerdictTableWrapsItsTextColumnsAtReadableType()
    {
        // Cells as long as the demo's (a plausibility that names two problems): at 9 pt the columns are ~1.6× the A4 text width.
        string[] columns = ["model", "ΔBIC", "evidence against the model", "size evolution a", "SB evolution b", "evolution plausible?", "converged"];
        IReadOnlyList<string> Row(string m) => [m, "4.8", "positive against", "−1.348 ± 0.035", "1.039 ± 0.023", "a: outside expected range; b: wrong sign (galaxies fading into the past)", "yes"];
        var wide = new ReportTable("summary", "Summary", columns, [Row("Einstein–de Sitter"), Row("static linear")]);
        var c = Content.Value;
        var report = new PdfReportWriter().Render(c with { Tables = c.Tables.Select(t => t.Id == "summary" ? wide : t).ToList() });
        // Every table, the verdict table first, at 7.5 pt or more (the old layout shrank this one to 6 pt and then scaled it to ~5 pt).
        Assert.Equal(PdfPageFlow.MinTableFontPt, report.TableFontSizes[0]);
        Assert.All(report.TableFontSizes, s => Assert.True(s >= PdfPageFlow.MinTableFontPt, $"a table is set in {s} pt"));
        // The wrapped cell stays inside its column: each of its words ends left of the "converged" column's "yes".
        var bbox = PdfToText(report.Bytes, "-bbox", "-f", "1", "-l", "1");
        var words = Regex.Matches(bbox, "<word xMin=\"([0-9.]+)\" yMin=\"([0-9.]+)\" xMax=\"([0-9.]+)\" yMax=\"([0-9.]+)\">([^<]*)</word>")
            .Select(m => (X0: D(m.Groups[1].Value), Y0: D(m.Groups[2].Value), X1: D(m.Groups[3].Value), Y1: D(m.Groups[4].Value), Text: m.Groups[5].Value)).ToList();
        double yesLeft = words.Where(w => w.Text == "yes").Min(w => w.X0);
        var cell = words.Where(w => w.Text is "fading" or "past)" or "(galaxies").ToList();
        Assert.Equal(4, cell.Count(w => w.Text is "fading" or "past)")); // both rows, every word drawn
        Assert.All(cell, w => Assert.True(w.X1 < yesLeft, $"'{w.Text}' ends at x = {w.X1}, past the next column at {yesLeft}"));
        // Readable type: a table word's box is at least 7 pt high (DejaVu Sans ascent + descent ≈ 1.16 em).
        Assert.All(cell, w => Assert.True(w.Y1 - w.Y0 >= 7.5 * 1.0, $"'{w.Text}' is {w.Y1 - w.Y0:0.0} pt high"));
    }

    private static double D(string s) => double.Parse(s, CultureInfo.InvariantCulture);

    [ToolFact("pdftotext")]
    public void TheFiguresHeadingIsAlwaysOnThePageOfTheFirstFigure()
    {
        // Push the heading down the page a few lines at a time: wherever it lands, it must share a page with Figure 1.
        var baseData = SyntheticReport.Create();
        for (int extra = 0; extra <= 24; extra += 3)
        {
            var data = baseData with { ExtraConclusions = [.. baseData.ExtraConclusions, .. Enumerable.Repeat("A note that takes one line of the report.", extra)] };
            var pages = PdfToText(new PdfReportWriter().Render(ReportContent.From(data)).Bytes).Split('\f');
            var withHeading = pages.Select((p, i) => (p, i)).Where(x => x.p.Split('\n').Any(l => l.Trim() == "Figures")).ToList();
            Assert.Single(withHeading);
            Assert.Contains("Figure 1.", withHeading[0].p);
        }
    }

    [ToolFact("pdftotext")]
    public void ProseParagraphsHaveSingleSpacesBetweenWords()
    {
        // Console-padded text ("theta     ← theta") as an assumption: the PDF prints it with one space.
        var data = SyntheticReport.Create();
        data = data with { Assumptions = [.. data.Assumptions, new("size definition", "the mapping used: id        ← id; theta     ← theta [arcsec]")] };
        var text = PdfToText(new PdfReportWriter().Render(ReportContent.From(data)).Bytes, "-raw");
        Assert.Contains("the mapping used: id ← id; theta ← theta [arcsec]", text);
    }

    [Fact]
    public void ProseTextCollapsesPaddingButKeepsLineBreaks()
    {
        Assert.Equal("id ← id; z ← z\nnext", SizeTest.Foundation.Text.ProseText.Collapse("id        ← id;  z\t\t← z\nnext"));
    }
}

using AngleSharp.Html.Parser;
using SizeTest.Reporting;
using SizeTest.Reporting.Html;
using SkiaSharp;
using Xunit;

namespace SizeTest.Tests.Reporting;

public sealed class HtmlReportTests
{
    private static readonly Lazy<ReportContent> Content = new(() => ReportContent.From(SyntheticReport.Create()));
    private static readonly Lazy<string> Page = new(() => new HtmlReportWriter().Render(Content.Value));

    [Fact]
    public void ParsesAndHasEverySectionInOrder()
    {
        var doc = new HtmlParser().ParseDocument(Page.Value);
        var ids = doc.QuerySelectorAll("section[data-section]").Select(s => s.Id).ToList();
        Assert.Equal(["verdict", "job-summary", "data-summary", "conclusions", "tables", "figures", "manifest"], ids);
        Assert.Equal(ids, doc.QuerySelectorAll("nav a").Select(a => a.GetAttribute("href")!.TrimStart('#')));
    }

    [Fact]
    public void EveryFigureIsInlineSvgWithACaption()
    {
        var doc = new HtmlParser().ParseDocument(Page.Value);
        var figures = doc.QuerySelectorAll("figure");
        Assert.Equal(Content.Value.Figures.Count, figures.Length);
        foreach (var f in figures)
        {
            Assert.NotNull(f.QuerySelector("svg"));
            Assert.StartsWith("Figure ", f.QuerySelector("figcaption")!.TextContent);
        }
        // Clip-path ids stay unique across the inlined figures.
        var allIds = doc.QuerySelectorAll("[id]").Select(e => e.Id).ToList();
        Assert.Equal(allIds.Count, allIds.Distinct().Count());
    }

    [Fact]
    public void IsSelfContained()
    {
        var doc = new HtmlParser().ParseDocument(Page.Value);
        Assert.Empty(doc.QuerySelectorAll("script"));
        Assert.Empty(doc.QuerySelectorAll("link[rel=stylesheet]"));
        foreach (var e in doc.QuerySelectorAll("[src], [href]"))
        {
            var v = e.GetAttribute("src") ?? e.GetAttribute("href") ?? "";
            Assert.True(v.StartsWith('#') || v.StartsWith("data:", StringComparison.Ordinal), $"external reference {v}");
        }
        Assert.DoesNotContain("http://", Page.Value.Replace("http://www.w3.org/", ""));
        Assert.DoesNotContain("https://", Page.Value);
    }

    [Fact]
    public void ConclusionsStandBesideTheirAssumptionsAndTheCaution()
    {
        var doc = new HtmlParser().ParseDocument(Page.Value);
        var sec = doc.GetElementById("conclusions")!;
        var pair = sec.QuerySelector(".pair")!;
        Assert.NotEmpty(pair.QuerySelectorAll(".conclusions li"));
        var topics = pair.QuerySelectorAll(".assumptions dt").Select(d => d.TextContent).ToList();
        Assert.Equal(["cosmology priors", "evolution form", "selection model", "K-corrections"], topics);
        Assert.Contains("do not say which model is true", sec.QuerySelector(".caution")!.TextContent);
        Assert.Contains("synthetic", doc.QuerySelector(".synthetic")!.TextContent);
    }

    [Fact]
    public void DataSummaryAndTablesCarryTheNumbers()
    {
        var doc = new HtmlParser().ParseDocument(Page.Value);
        var kv = doc.GetElementById("data-summary")!.QuerySelectorAll("table.kv tr").ToDictionary(r => r.QuerySelector("th")!.TextContent, r => r.QuerySelector("td")!.TextContent);
        Assert.Equal("317", kv["rows read"]); // fixture: 300 accepted + 17 rejected
        Assert.Equal("300", kv["accepted"]);
        Assert.Equal("17", kv["rejected"]);
        var cmp = doc.GetElementById("table-comparison")!;
        Assert.Equal(3, cmp.QuerySelectorAll("tbody tr").Length);
        var par = doc.GetElementById("table-parameters")!;
        Assert.Equal(Content.Value.Data.Models.Sum(m => m.Fit.Parameters.Count), par.QuerySelectorAll("tbody tr").Length);
        Assert.Contains("7", doc.QuerySelector(".provenance")!.TextContent);
        Assert.Null(doc.QuerySelector("pre.manifest")); // the full JSON stays in manifest.json
    }

    /// <summary>Screenshots a page in headless Chromium; returns the exit code, stderr and the console lines it logged.</summary>
    private static (int Exit, string Err, IReadOnlyList<string> Console) Screenshot(string html, string shot)
    {
        var profile = Directory.CreateTempSubdirectory("sizetest-chromium-");
        try
        {
            var (exit, _, err) = ExternalTool.Run("chromium",
            [
                "--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update",
                "--disable-sync", "--no-first-run", $"--user-data-dir={profile.FullName}", "--enable-logging=stderr", "--v=0",
                $"--screenshot={shot}", "--window-size=1200,900", new Uri(html).AbsoluteUri,
            ], 180_000);
            // Chromium logs every console message (errors and uncaught exceptions included) as ":CONSOLE" lines.
            var console = err.Split('\n').Where(l => l.Contains(":CONSOLE", StringComparison.Ordinal) || l.Contains("Uncaught", StringComparison.Ordinal)).ToList();
            return (exit, err, console);
        }
        finally { try { profile.Delete(true); } catch (IOException) { } }
    }

    [ToolFact("chromium")]
    public void RendersInHeadlessChromiumWithoutConsoleMessages()
    {
        var dir = Directory.CreateTempSubdirectory("sizetest-html-");
        try
        {
            var html = Path.Combine(dir.FullName, "report.html");
            File.WriteAllText(html, Page.Value);
            var shot = Path.Combine(dir.FullName, "shot.png");
            var (exit, err, console) = Screenshot(html, shot);
            Assert.True(exit == 0, $"chromium exited with {exit}: {err}");
            Assert.True(File.Exists(shot), "no screenshot written");
            Assert.Empty(console);
            using var bmp = SKBitmap.Decode(File.ReadAllBytes(shot));
            Assert.Equal(1200, bmp.Width);
            // The page shows text, not a blank screen.
            Assert.True(PixelCheck.NonWhite(bmp) > 2000, "screenshot is nearly blank");
            var keep = Environment.GetEnvironmentVariable("SIZETEST_KEEP_SCREENSHOT");
            if (!string.IsNullOrEmpty(keep)) File.Copy(shot, keep, true);
        }
        finally { dir.Delete(true); }
    }

    [ToolFact("chromium")]
    public void ConsoleCheckCatchesAPageWithAnError()
    {
        // Negative control for the check above: a page whose script throws must be caught.
        var dir = Directory.CreateTempSubdirectory("sizetest-html-bad-");
        try
        {
            var html = Path.Combine(dir.FullName, "bad.html");
            File.WriteAllText(html, "<!DOCTYPE html><html><body><p>x</p><script>undefinedFunction();</script></body></html>");
            var (_, _, console) = Screenshot(html, Path.Combine(dir.FullName, "bad.png"));
            Assert.Contains(console, l => l.Contains("Uncaught ReferenceError", StringComparison.Ordinal));
        }
        finally { dir.Delete(true); }
    }
}

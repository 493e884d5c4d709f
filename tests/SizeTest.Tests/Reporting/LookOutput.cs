using SizeTest.Reporting;
using SizeTest.Reporting.Pack;
using SizeTest.Reporting.Rendering;
using Xunit;

namespace SizeTest.Tests.Reporting;

/// <summary>
/// Renders the synthetic report's first figure twice and requires identical PNG and figure-PDF
/// bytes (the determinism the report pack promises). With SIZETEST_LOOK_DIR set it also writes
/// full synthetic report folders there (sparse and dense samples) for looking at by eye, and
/// checks that each folder holds the HTML page, the PDF and the figures.
/// </summary>
public sealed class LookOutput
{
    [Fact]
    public void FiguresRenderRepeatablyAndLookFoldersAreComplete()
    {
        var dir = Environment.GetEnvironmentVariable("SIZETEST_LOOK_DIR");
        var samples = string.IsNullOrEmpty(dir) ? new[] { ("sparse", 300) } : new[] { ("sparse", 300), ("dense", 5000) };
        var log = new System.Text.StringBuilder();
        foreach (var (name, n) in samples)
        {
            var content = ReportContent.From(SyntheticReport.Create(n, seed: 3));
            Assert.NotEmpty(content.Figures);
            var png1 = FigureRenderer.RenderPng(content.Figures[0]).Bytes;
            var png2 = FigureRenderer.RenderPng(content.Figures[0]).Bytes;
            Assert.True(png1.AsSpan().SequenceEqual(png2), $"{name}: PNG of {content.Figures[0].Id} differs between two renders");
            var pdf1 = FigureRenderer.RenderPdf(content.Figures[0]);
            var pdf2 = FigureRenderer.RenderPdf(content.Figures[0]);
            Assert.True(pdf1.AsSpan().SequenceEqual(pdf2), $"{name}: figure PDF of {content.Figures[0].Id} differs between two renders");
            if (string.IsNullOrEmpty(dir)) continue;

            var sw = System.Diagnostics.Stopwatch.StartNew();
            var folder = Path.Combine(dir, name);
            new ReportPackWriter().Write(folder, true, content);
            log.AppendLine($"{name}: {content.Figures.Count} figures; whole report folder in {sw.Elapsed.TotalSeconds:0.00} s");
            Assert.True(File.Exists(Path.Combine(folder, "report.html")), $"{folder}/report.html missing");
            Assert.True(File.Exists(Path.Combine(folder, "report.pdf")), $"{folder}/report.pdf missing");
            Assert.Equal(content.Figures.Count, Directory.GetFiles(Path.Combine(folder, "figures"), "*.png").Length);
        }
        if (!string.IsNullOrEmpty(dir)) File.WriteAllText(Path.Combine(dir, "timings.txt"), log.ToString());
    }
}

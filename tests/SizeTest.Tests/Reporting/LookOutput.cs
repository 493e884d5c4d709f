using SizeTest.Reporting;
using SizeTest.Reporting.Pack;
using Xunit;

namespace SizeTest.Tests.Reporting;

/// <summary>Writes a full synthetic report folder when SIZETEST_LOOK_DIR is set (for looking at the output by eye); otherwise does nothing.</summary>
public sealed class LookOutput
{
    [Fact]
    public void WritesAReportToLookAtWhenAsked()
    {
        var dir = Environment.GetEnvironmentVariable("SIZETEST_LOOK_DIR");
        if (string.IsNullOrEmpty(dir)) return;
        var log = new System.Text.StringBuilder();
        foreach (var (name, n) in new[] { ("sparse", 300), ("dense", 5000) })
        {
            var content = ReportContent.From(SyntheticReport.Create(n, seed: 3));
            var sw = System.Diagnostics.Stopwatch.StartNew();
            foreach (var f in content.Figures) SizeTest.Reporting.Rendering.FigureRenderer.RenderPng(f);
            log.AppendLine($"{name}: {content.Figures.Count} figures as 300-dpi PNG in {sw.Elapsed.TotalSeconds:0.00} s");
            sw.Restart();
            new ReportPackWriter().Write(Path.Combine(dir, name), true, content);
            log.AppendLine($"{name}: whole report folder in {sw.Elapsed.TotalSeconds:0.00} s");
            var png1 = SizeTest.Reporting.Rendering.FigureRenderer.RenderPng(content.Figures[0]).Bytes;
            var png2 = SizeTest.Reporting.Rendering.FigureRenderer.RenderPng(content.Figures[0]).Bytes;
            var pdf1 = SizeTest.Reporting.Rendering.FigureRenderer.RenderPdf(content.Figures[0]);
            var pdf2 = SizeTest.Reporting.Rendering.FigureRenderer.RenderPdf(content.Figures[0]);
            log.AppendLine($"{name}: PNG repeatable {png1.AsSpan().SequenceEqual(png2)}, figure PDF repeatable {pdf1.AsSpan().SequenceEqual(pdf2)}");
        }
        File.WriteAllText(Path.Combine(dir, "timings.txt"), log.ToString());
    }
}

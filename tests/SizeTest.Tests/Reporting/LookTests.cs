using Xunit;
using SizeTest.Reporting.Figures;
using SizeTest.Reporting.Rendering;

namespace SizeTest.Tests.Reporting;

public sealed class LookTests
{
    [Fact]
    public void WritesFiguresForLooking()
    {
        var dir = Path.Combine(Path.GetTempPath(), "sizetest-look");
        Directory.CreateDirectory(dir);
        foreach (var dense in new[] { false, true })
        {
            var data = SyntheticReport.Create(dense ? 5000 : 300);
            foreach (var f in ReportFigures.Build(data))
            {
                var png = FigureRenderer.RenderPng(f, 100);
                File.WriteAllBytes(Path.Combine(dir, f.Id + (dense ? "-dense" : "") + ".png"), png.Bytes);
                File.WriteAllText(Path.Combine(dir, f.Id + (dense ? "-dense" : "") + ".svg"), FigureRenderer.RenderSvg(f));
                File.WriteAllBytes(Path.Combine(dir, f.Id + (dense ? "-dense" : "") + ".pdf"), FigureRenderer.RenderPdf(f));
            }
        }
    }
}

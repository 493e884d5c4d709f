using AngleSharp.Html.Parser;
using SizeTest.Reporting;
using SizeTest.Reporting.Data;
using SizeTest.Reporting.Html;
using SizeTest.Reporting.Pdf;
using SizeTest.Reporting.Rendering;
using Xunit;

namespace SizeTest.Tests.Reporting;

/// <summary>Reports from nearly empty results still render: figures that cannot be filled are left out, never drawn broken.</summary>
public sealed class SparseDataTests
{
    private static ReportData Minimal(bool withTheta) => new()
    {
        Job = new JobSummary("Minimal", "", "tiny.csv", "0.1.0", "", 1),
        Data = new DataSummary(3, 3, 0, []),
        Objects = new ObjectPoints([0.1, 0.5, 1.2]) { ThetaArcsec = withTheta ? [3.0, 1.0, -1.0] : null },
        Models = [],
        Assumptions = [],
    };

    [Fact]
    public void NoModelsNoSizesGiveNoFiguresButAFullReport()
    {
        var content = ReportContent.From(Minimal(false));
        Assert.Empty(content.Figures);
        Assert.Contains("No model was fitted.", content.Conclusions);
        var doc = new HtmlParser().ParseDocument(new HtmlReportWriter(embedFont: false).Render(content));
        Assert.Equal(7, doc.QuerySelectorAll("section[data-section]").Length);
        Assert.Contains("No figure could be drawn", doc.GetElementById("figures")!.TextContent);
        Assert.Contains("No row was rejected", doc.GetElementById("data-summary")!.TextContent);
        Assert.True(new PdfReportWriter().Render(content).Pages >= 1); // no empty pages: sections flow on
    }

    [Fact]
    public void NonPositiveSizesAreLeftOffTheLogAxisAndCounted()
    {
        var content = ReportContent.From(Minimal(true));
        var fig = Assert.Single(content.Figures);
        var layout = FigureRenderer.RenderPng(fig, 40).Layout;
        Assert.Equal(1, layout.Panels[0].PointsDropped); // θ = −1 cannot sit on a log axis
        Assert.Single(fig.Panels); // no model, so no residual panel
    }
}

using SizeTest.Inference;
using SizeTest.Inference.Comparison;
using SizeTest.Reporting;
using SizeTest.Reporting.Html;
using SizeTest.Reporting.Pdf;
using SizeTest.Reporting.Tables;
using Xunit;

namespace SizeTest.Tests.Reporting;

/// <summary>Bootstrap and cross-validation results appear in the report as tables with a sentence of what they mean.</summary>
public sealed class ResamplingTablesTests
{
    // Made-up resampling results on the synthetic fixture (SyntheticReport: ΛCDM size_evolution −0.98 in [−1.08, −0.88],
    // omega_m 0.31 in [0.27, 0.35]): the bootstrap interval of size_evolution is twice as wide (0.4 / 0.2 = 2.00, flagged
    // above the factor 1.5), omega_m's the same width (ratio 1.00).
    private static SizeTest.Reporting.Data.ReportData Data() => SyntheticReport.Create() with
    {
        Bootstrap = [new BootstrapResult("lcdm", 50, 2, [new("size_evolution", -0.97, -1.17, -0.77, 0.2), new("omega_m", 0.31, 0.27, 0.35, 0.04)])],
        CrossValidation =
        [
            new CrossValidationResult("lcdm", 5, -170.0, 6.0, 0),
            new CrossValidationResult("static-linear", 5, -181.0, 6.5, 1),
            new CrossValidationResult("tired-light", 5, -171.0, 6.1, 0),
        ],
        CrossValidationDifferences =
        [
            new CrossValidationDifference("lcdm", "lcdm", 0, 0, 5, false),
            new CrossValidationDifference("static-linear", "lcdm", -11.0, 2.0, 5, false),
            new CrossValidationDifference("tired-light", "lcdm", -1.0, 1.24, 5, false),
        ],
    };

    [Fact]
    public void BootstrapTableSetsEachIntervalBesideTheFitsWithTheWidthRatio()
    {
        var t = ResamplingTables.Bootstrap(Data())!;
        var se = t.Rows.Single(r => r[1] == "size_evolution");
        Assert.Equal("ΛCDM", se[0]);
        Assert.Equal("−0.98 ± 0.10", se[2]);          // the fit's Hessian-style symmetric interval, PDG-rounded
        Assert.Equal("2.00", se[5]);                   // (−0.77 − −1.17) / (−0.88 − −1.08) = 0.4 / 0.2
        Assert.Equal("48 of 50", se[6]);               // 2 failed refits are left out
        Assert.Equal("1.00", t.Rows.Single(r => r[1] == "omega_m")[5]);
        var sentence = ResamplingTables.BootstrapSentence(Data())!;
        Assert.Contains("ΛCDM size_evolution (2.00×)", sentence);
        Assert.DoesNotContain("omega_m", sentence);
        Assert.Contains("uncertain by about 10 %", sentence); // 1/√(2·48) = 0.102
    }

    [Fact]
    public void CrossValidationTableAndSentenceSayWhatSeparates()
    {
        var t = ResamplingTables.CrossValidation(Data())!;
        Assert.Equal(["ΛCDM", "tired light", "static linear"], t.Rows.Select(r => r[0]));    // by CV ln p, highest first
        Assert.Equal("0 (highest)", t.Rows[0][3]);
        Assert.Equal("−11.0 ± 2.0", t.Rows[2][3]);
        var s = ResamplingTables.CrossValidationSentence(Data())!;
        Assert.StartsWith("Cross-validation (5 folds): ΛCDM predicts held-out objects best", s);
        Assert.Contains("static linear lower by 11.0 ± 2.0 in ln p (5.5 SE)", s);               // 11 / 2
        Assert.Contains("tired light lower by 1.0 ± 1.2 in ln p (0.8 SE: not separated)", s);   // 1 / 1.24 = 0.81 < 2
    }

    [Fact]
    public void NoTablesWhenTheStudyRanNeither()
    {
        var content = ReportContent.From(SyntheticReport.Create());
        Assert.DoesNotContain(content.Tables, t => t.Id is ResamplingTables.BootstrapId or ResamplingTables.CrossValidationId);
        Assert.DoesNotContain("table-bootstrap", new HtmlReportWriter(embedFont: false).Render(content));
    }

    [ToolFact("pdftotext")]
    public void HtmlAndPdfShowBothTablesWithTheirSentences()
    {
        var content = ReportContent.From(Data());
        Assert.Contains(content.Tables, t => t.Id == ResamplingTables.BootstrapId);
        var html = new HtmlReportWriter(embedFont: false).Render(content);
        Assert.Contains("id=\"table-bootstrap\"", html);
        Assert.Contains("id=\"table-cross-validation\"", html);
        Assert.Contains("id=\"says-bootstrap\"", html);
        Assert.Contains("predicts held-out objects best", html);
        var text = System.Text.RegularExpressions.Regex.Replace(ExternalTool.PdfText(new PdfReportWriter().Render(content).Bytes, "-raw"), "\\s+", " ");
        Assert.Contains("Bootstrap intervals against the fit's intervals", text);
        Assert.Contains("Cross-validation score per model", text);
        Assert.Contains("ΛCDM size_evolution (2.00×)", text);
        Assert.Contains("static linear lower by 11.0 ± 2.0 in ln p", text);
    }

    [Fact]
    public void ReportDataJsonKeepsThemForRedraw()
    {
        var back = SizeTest.Reporting.Data.ReportDataJson.FromJson(SizeTest.Reporting.Data.ReportDataJson.ToJson(Data()), "x");
        Assert.Equal(-1.17, back.Bootstrap[0].Intervals[0].Lo);
        Assert.Equal(-181.0, back.CrossValidation[1].LogPredictiveDensity);
        Assert.Equal(-11.0, back.CrossValidationDifferences[1].Difference);
    }
}

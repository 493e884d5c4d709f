using SizeTest.Reporting;
using SizeTest.Reporting.Pdf;
using SizeTest.Simulation;
using SizeTest.Studies;
using SizeTest.Tests.Reporting;
using Xunit;

namespace SizeTest.Tests.Studies;

/// <summary>The report's power section reads target and threshold from power.json and states a conclusion for the study's N.</summary>
public sealed class PowerReportTests
{
    // Made-up power numbers (not a claim about any survey), with a target (0.7) and a threshold (ΔBIC 8) that are not the defaults,
    // so a report that re-states 0.9 / 10 (power) or 0.8 (the old figure default) fails.
    private static PowerResult Power(double target = 0.7, double decisive = 8) => new()
    {
        TrueModel = "lcdm", TrueModelParameters = new Dictionary<string, double> { ["omega_m"] = 0.3 }, TrueNuisance = new Dictionary<string, double> { ["size_evolution"] = -1 },
        Candidates = ["lcdm", "tired-light"], TrueCandidate = "lcdm", Observable = SizeTest.Inference.ObservableKind.Size, Kind = "galaxy", ZDist = "uniform:0.1:2.5",
        Seed = 1, Mocks = 20, TargetPower = target, DecisiveDeltaBic = decisive, StrongDeltaBic = 5, Conclusion = "made up", Outcomes = [],
        RequiredSampleSize = 1600,
        Points =
        [
            new(100, 20, 0.6, 0.30, 0.10, [0, 0, 1, 0, 0], 2, [], 0, "weak"),
            new(400, 20, 0.8, 0.55, 0.45, [0, 0, 4, 0, 0], 5, [], 0, "weak"),
            new(1600, 20, 0.95, 0.90, 0.75, [0, 0, 12, 0, 0], 14, [], 0, "decisive"),
        ],
    };

    [Fact]
    public void TargetAndThresholdComeFromPowerJson()
    {
        var curve = PowerReport.From(Power(), 2000, ["lcdm", "tired-light"]);
        Assert.Equal(0.7, curve.Target);
        Assert.Equal(8, curve.DecisionDeltaBic);
        Assert.Contains(curve.Lines, l => l.Label.Contains("ΔBIC > 8", StringComparison.Ordinal) && l.Power.SequenceEqual([0.10, 0.45, 0.75]));
        Assert.Contains(curve.Lines, l => l.Label.Contains("ΔBIC > 5", StringComparison.Ordinal));
        Assert.Contains(curve.Assumptions, a => a.Contains("ΔBIC > 8", StringComparison.Ordinal) && a.Contains("70", StringComparison.Ordinal));
    }

    [Fact]
    public void StatementReadsTheLargestGridSizeNotAboveTheSample()
    {
        // n = 2000: read at N = 1600, where P(ΔBIC > 8) = 0.75 ≥ target 0.7 → decides.
        var decides = PowerReport.Statement(Power(), 2000);
        Assert.Contains("With 1600 objects (the largest mock catalogue not above this sample's 2000)", decides);
        Assert.Contains("decides in 75 % of 20 mocks at ΔBIC > 8 (target 70 %", decides);
        Assert.DoesNotContain("cannot", decides);
        // n = 400 exactly on the grid: 0.45 < 0.7 → cannot decide, and the N that would.
        var cannot = PowerReport.Statement(Power(), 400);
        Assert.StartsWith("With 400 objects, on mocks drawn from ΛCDM, the sample cannot decide", cannot);
        Assert.Contains("in only 45 % of 20 mocks (target 70 %; ΔBIC > 5 in 55 %)", cannot);
        Assert.Contains("reaches the target at N = 1600", cannot);
        // With a target of 0.8 even N = 1600 does not decide.
        Assert.Contains("no sample size of the power analysis (up to 1600) reaches the target", PowerReport.Statement(Power(target: 0.8) with { RequiredSampleSize = null }, 5000));
        // Below the grid: no claim.
        Assert.StartsWith("Power cannot be stated for this sample: it has 50 objects", PowerReport.Statement(Power(), 50));
    }

    [Fact]
    public void NotInterpretablePowerClaimsNothing()
    {
        var p = Power() with { Points = [new(100, 20, 0.6, 0.3, 0.9, [0, 0, 1, 0, 0], 2, [], 0, PowerAnalysis.NotInterpretable) { RecoveryFailures = ["size_evolution biased"] }] };
        var s = PowerReport.Statement(p, 100);
        Assert.Contains("not interpretable", s);
        Assert.Contains("size_evolution biased", s);
        Assert.DoesNotContain("decides", s);
    }

    [Fact]
    public void OtherCandidatesThanTheStudyFitsAreSaid()
    {
        var a = PowerReport.Assumptions(Power(), ["lcdm", "eds"]);
        Assert.Contains(a, l => l.Contains("not in it: Einstein–de Sitter", StringComparison.Ordinal) && l.Contains("only in it: tired light", StringComparison.Ordinal));
    }

    [Fact]
    public void AnOlderPowerJsonWithoutThresholdsReadsAsTheValuesThen()
    {
        // power.json before decisive_delta_bic / strong_delta_bic existed: the analysis used 10 and 6 (PowerAnalysis).
        var json = PowerResultFiles.Json(Power());
        var old = System.Text.RegularExpressions.Regex.Replace(json, "\\s*\"(decisive|strong)_delta_bic\": [0-9.]+,", "");
        Assert.DoesNotContain("delta_bic\": ", old.Split("\"points\"")[0]);
        var read = PowerResultFiles.ReadJson(old);
        Assert.Equal(10, read.DecisiveDeltaBic);
        Assert.Equal(6, read.StrongDeltaBic);
        Assert.Equal(8, PowerResultFiles.ReadJson(json).DecisiveDeltaBic);
    }

    [ToolFact("pdftotext")]
    public void HtmlAndPdfStateThePowerConclusionBesideItsAssumptions()
    {
        var data = SyntheticReport.Create() with { Power = PowerReport.From(Power(), 2000, ["lcdm", "tired-light"]) };
        var content = ReportContent.From(data);
        var html = new SizeTest.Reporting.Html.HtmlReportWriter(embedFont: false).Render(content);
        var block = html[html.IndexOf("<div class=\"power\"", StringComparison.Ordinal)..];
        block = block[..block.IndexOf("</div>", StringComparison.Ordinal)];
        Assert.Contains("decides in 75 % of 20 mocks at ΔBIC &gt; 8", block);
        Assert.Contains("decision rule: the true model wins by ΔBIC &gt; 8", block);
        var text = System.Text.RegularExpressions.Regex.Replace(ExternalTool.PdfText(new PdfReportWriter().Render(content).Bytes, "-raw"), "\\s+", " ");
        int heading = text.IndexOf("Power of this design", StringComparison.Ordinal);
        Assert.True(heading >= 0);
        Assert.Contains("decides in 75 % of 20 mocks at ΔBIC > 8 (target 70 %", text[heading..]);
        Assert.Contains("It assumes:", text[heading..]);
    }
}

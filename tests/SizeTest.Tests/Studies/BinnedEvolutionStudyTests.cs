using SizeTest.Catalogues.Text;
using SizeTest.Cosmology;
using SizeTest.Reporting.Figures;
using SizeTest.Simulation;
using SizeTest.Studies;
using Xunit;

namespace SizeTest.Tests.Studies;

/// <summary>
/// A study with <c>[survey] evolution = "binned:K"</c>: the report carries each model's fitted R0 per bin and the same model's
/// power-law fit, and draws them in the binned-evolution figure.
/// </summary>
public sealed class BinnedEvolutionStudyTests(Xunit.Abstractions.ITestOutputHelper output)
{
    [Fact]
    public void BinnedStudyReportsEachModelsBinsAndItsPowerLaw()
    {
        // Truth: flat ΛCDM, R = 5 kpc (1+z)^−1 with 0.2 dex scatter, 5% size errors (simulate's defaults), z uniform in 0.1–2.5.
        using var fx = new StudyFixture(n: 3000);
        var lcdm = WorldModels.Get("lcdm").Create(new Dictionary<string, double>());
        var mock = MockSurveyGenerator.Generate(new MockSurveySpec(lcdm, new SurveyDesign(3000, RedshiftDistribution.Uniform(0.1, 2.5)), 7), parallel: false);
        CsvTableWriter.Write(Path.Combine(fx.Dir, "mock.csv"), mock.ToTable("mock"));
        File.WriteAllText(fx.StudyPath, Study("binned", "size", 5));
        var outcome = StudyRunner.Run(StudyFileParser.Load(fx.StudyPath), new StudyRunOptions { OutputDirectory = fx.Out(), Force = true });
        var lc = outcome.Report.Models.Single(m => m.Fit.Name == "lcdm");
        var evo = Assert.Single(lc.BinnedEvolution);
        Assert.Equal(5, evo.Bins.Count);
        var law = Assert.IsType<SizeTest.Reporting.Data.PowerLawSize>(evo.PowerLaw);
        output.WriteLine($"power law: R0 = {law.R0Kpc:F3} kpc, a = {law.SizeEvolution:F3} [{law.Lo:F3}, {law.Hi:F3}]");
        // The power-law counterpart recovers the truth a = −1 within 2 half-widths of its 68% interval (common practice).
        Assert.InRange(-1.0, law.SizeEvolution - 2 * (law.SizeEvolution - law.Lo), law.SizeEvolution + 2 * (law.Hi - law.SizeEvolution));
        foreach (var b in evo.Bins)
        {
            output.WriteLine($"bin {b.ZLow:F3}–{b.ZHigh:F3}: z_eff {b.ZEffective:F3}, R0 = {b.R0Kpc:F3} [{b.Lo:F3}, {b.Hi:F3}], power law {law.At(b.ZEffective):F3}");
            Assert.InRange(b.ZEffective, b.ZLow, b.ZHigh);
            // Drawn at z_eff the bin measures the power law exactly when the power law holds (BinnedSizeEvolution's remarks): the
            // fitted power law lies within 2 half-widths of each bin's 68% interval (common practice).
            double p = law.At(b.ZEffective);
            Assert.InRange(p, b.R0Kpc - 2 * (b.R0Kpc - b.Lo), b.R0Kpc + 2 * (b.Hi - b.R0Kpc));
        }
        Assert.Equal(3000, evo.Bins.Sum(b => b.Count));
        Assert.Contains(outcome.Result.Notes, n => n.StartsWith("binned evolution: the binned-evolution figure", StringComparison.Ordinal) && n.Contains("lcdm: size_evolution = "));
        // The figure is in the report, one panel per model.
        var figure = ReportFigures.Build(outcome.Report).Single(f => f.Id == BinnedEvolutionFigure.Id);
        Assert.Equal(2, figure.Panels.Count);
        Assert.True(File.Exists(Path.Combine(fx.Out(), "figures", BinnedEvolutionFigure.Id + ".svg")));
        Assert.Contains($"id=\"fig-{BinnedEvolutionFigure.Id}\"", File.ReadAllText(Path.Combine(fx.Out(), "report.html")));
        // The words fit a binned fit: Figure 1 says why no R0 (1+z)^a line is drawn, the evolution tests do not claim "no free
        // evolution term", and the Tolman figure of a size-only fit does not describe model lines it does not draw.
        var figures = ReportFigures.Build(outcome.Report);
        Assert.Contains("No model line is drawn: with binned evolution each model has one R0 per redshift bin (5 bins)", figures.Single(f => f.Id == AngularSizeFigure.Id).Caption);
        Assert.Contains("fitted to the sizes only", figures.Single(f => f.Id == SurfaceBrightnessFigure.Id).Caption);
        var html = File.ReadAllText(Path.Combine(fx.Out(), "report.html"));
        Assert.DoesNotContain("No model had a free evolution term", html);
        Assert.Contains("With binned evolution (5 redshift bins) no model has an evolution exponent to test against zero", html);
        Assert.DoesNotContain("its line is the best fit including its fitted size evolution", html);
    }

    [Fact]
    public void JointBinnedStudyDrawsTheMu0BinsOfResultsJsonBesideTheR0Bins()
    {
        // Truth: flat ΛCDM, R = 5 kpc (1+z)^−1, μ0 = 21 mag/arcsec², b = 1 (simulate's defaults), z uniform in 0.1–2.5.
        using var fx = new StudyFixture(n: 2000);
        File.WriteAllText(fx.StudyPath, Study("binned-joint", "joint", 4));
        var outcome = StudyRunner.Run(StudyFileParser.Load(fx.StudyPath), new StudyRunOptions { OutputDirectory = fx.Out(), Force = true });
        var figure = ReportFigures.Build(outcome.Report).Single(f => f.Id == BinnedEvolutionFigure.Id);
        // One row per model: R0 left, μ0 right.
        Assert.Equal(4, figure.Panels.Count);
        Assert.Equal(2, figure.Columns);
        using var results = System.Text.Json.JsonDocument.Parse(File.ReadAllText(Path.Combine(fx.Out(), "results.json")));
        int row = 0;
        foreach (var model in results.RootElement.GetProperty("models").EnumerateArray())
        {
            var parameters = model.GetProperty("parameters");
            var mu0 = Enumerable.Range(1, 4).Select(k => parameters.GetProperty($"mu0_bin{k}").GetProperty("value").GetDouble()).ToArray();
            var r0 = Enumerable.Range(1, 4).Select(k => parameters.GetProperty($"r0_kpc_bin{k}").GetProperty("value").GetDouble()).ToArray();
            var sbPanel = figure.Panels.Single(p => p.Row == row && p.Column == 1);
            var sizePanel = figure.Panels.Single(p => p.Row == row && p.Column == 0);
            Assert.Equal("mag/arcsec²", sbPanel.Y.Unit);
            var sbBins = Assert.Single(sbPanel.Series.OfType<BinnedSeries>());
            var sizeBins = Assert.Single(sizePanel.Series.OfType<BinnedSeries>());
            output.WriteLine($"{model.GetProperty("name").GetString()}: mu0_bin = {string.Join(", ", mu0.Select(v => v.ToString("F4")))}; drawn {string.Join(", ", sbBins.Y.Select(v => v.ToString("F4")))}");
            // The drawn bins are results.json's mu0_binK and r0_kpc_binK (the same numbers, written at full precision).
            Assert.Equal(4, sbBins.Y.Count);
            Assert.Equal(4, sizeBins.Y.Count);
            for (int k = 0; k < 4; k++)
            {
                Assert.Equal(mu0[k], sbBins.Y[k], 1e-9);
                Assert.Equal(r0[k], sizeBins.Y[k], 1e-9);
            }
            // The power law over the μ0 bins is drawn (the refit converged), and its b is in the panel's corner.
            Assert.Single(sbPanel.Series.OfType<LineSeries>());
            Assert.Contains(": b = ", sbPanel.Note, StringComparison.Ordinal);
            row++;
        }
        // ΛCDM is the truth: b of the power-law refit lies within 2 half-widths of its 68% interval of 1 (common practice), and the
        // bins, drawn at their effective redshifts, agree with its μ0 − 2.5 b log10(1+z_eff) (BinnedSurfaceBrightnessEvolution's
        // remarks): χ² = Σ ((μ0_k − law)/σ_k)² over K = 4 bins with 2 parameters refitted to the same objects has 2 degrees of freedom,
        // whose survival function is exp(−χ²/2), so χ² < −2 ln 0.001 = 13.8 at 99.9% (derived here).
        var sb = Assert.Single(outcome.Report.Models.Single(m => m.Fit.Name == "lcdm").BinnedSurfaceBrightness);
        var law = Assert.IsType<SizeTest.Reporting.Data.PowerLawSurfaceBrightness>(sb.PowerLaw);
        output.WriteLine($"lcdm power law: μ0 = {law.Mu0:F3}, b = {law.SbEvolution:F3} [{law.Lo:F3}, {law.Hi:F3}]");
        Assert.InRange(1.0, law.SbEvolution - 2 * (law.SbEvolution - law.Lo), law.SbEvolution + 2 * (law.Hi - law.SbEvolution));
        double chi2 = 0;
        foreach (var b in sb.Bins)
        {
            double pull = (b.Mu0 - law.At(b.ZEffective)) / ((b.Hi - b.Lo) / 2);
            chi2 += pull * pull;
            output.WriteLine($"bin {b.ZLow:F3}–{b.ZHigh:F3}: z_eff {b.ZEffective:F3}, μ0 = {b.Mu0:F3} [{b.Lo:F3}, {b.Hi:F3}], power law {law.At(b.ZEffective):F3}, pull {pull:F2}");
            Assert.InRange(b.ZEffective, b.ZLow, b.ZHigh);
        }
        output.WriteLine($"χ² = {chi2:F2} (2 dof)");
        Assert.InRange(chi2, 0, -2 * Math.Log(0.001));
        Assert.Equal(2000, sb.Bins.Sum(b => b.Count));
    }

    /// <summary>A study of the fixture's mock.csv: ΛCDM and tired light, <paramref name="observable"/>, binned evolution in <paramref name="bins"/> bins.</summary>
    private static string Study(string name, string observable, int bins) => $"""
        name = "{name}"
        seed = 3
        [catalogue]
        path = "mock.csv"
        synthetic = true
        [models]
        names = ["lcdm", "tired-light"]
        observable = "{observable}"
        [inference]
        starts = 1
        [survey]
        evolution = "binned:{bins}"
        [report]
        formats = ["html", "svg"]
        bin_resamples = 20
        """;
}

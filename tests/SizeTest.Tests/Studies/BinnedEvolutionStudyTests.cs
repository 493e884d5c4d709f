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
        File.WriteAllText(fx.StudyPath, """
            name = "binned"
            seed = 3
            [catalogue]
            path = "mock.csv"
            synthetic = true
            [models]
            names = ["lcdm", "tired-light"]
            observable = "size"
            [inference]
            starts = 1
            [survey]
            evolution = "binned:5"
            [report]
            formats = ["html", "svg"]
            bin_resamples = 20
            """);
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
    }
}

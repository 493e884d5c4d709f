using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Inference.Comparison;
using SizeTest.Inference.Survey;
using SizeTest.Simulation;
using Xunit;
using static SizeTest.Tests.Inference.Survey.SurveyFitting;

namespace SizeTest.Tests.Inference.Survey;

/// <summary>
/// --group: each population's required evolution (its own a with interval and likelihood-ratio test against 0) per world
/// model in the results, the evolution-test table and results.json, with the combined comparison stated in the notes.
/// </summary>
public sealed class PerGroupRequiredEvolutionTests(Xunit.Abstractions.ITestOutputHelper output)
{
    [Fact]
    [Trait("Category", "Slow")]
    public void EachGroupsRequiredEvolutionIsStatedPerModelWithItsOwnTest()
    {
        // Truth (flat ΛCDM, Ωm = 0.3): early 40% R0 = 3 kpc, a = −1.5, 0.15 dex; late 60% R0 = 6 kpc, a = −0.75, 0.2 dex.
        var pops = new[] { new MockSubpopulation("early", 0.4, 3, -1.5, 0, 0.15), new MockSubpopulation("late", 0.6, 6, -0.75, 0, 0.2) };
        var mock = Draw(new LambdaCdmModel(70, 0.3), 3000, seed: 8, zDist: "uniform:0.1:2.5", survey: new SurveyPopulation(Populations: pops),
            errors: new MeasurementErrors(0.05, MuErrorMag: 0));
        var obs = mock.ToObservables();
        var nuisance = new NuisanceModel(ObservableKind.Size, Survey: new SurveyModel(Groups: ["early", "late"]));
        var hypotheses = new[] { Hypothesis.Create(WorldModels.LambdaCdm, nuisance), Hypothesis.Create(WorldModels.Get("static-linear"), nuisance) };
        var result = FitRun.Run(new FitRequest { Hypotheses = hypotheses, Observables = obs, Starts = 1, CrossValidationFolds = 0 });

        foreach (var model in new[] { "lcdm", "static-linear" })
            foreach (var group in new[] { "early", "late" })
            {
                var r = result.RequiredEvolution.Single(e => e.Model == model && e.Group == group);
                Assert.Equal($"size_evolution@{group}", r.Parameter);
                Assert.NotNull(r.PValue); // its own likelihood-ratio test against a = 0 was run
                Assert.Contains($"of group {group}", r.Verdict, StringComparison.Ordinal);
                output.WriteLine($"{model} {group}: a = {r.Value:F3} [{r.Lo:F3}, {r.Hi:F3}], p = {r.PValue:G3}");
            }
        // ΛCDM is the truth: each group's a within 2 half-widths of its 68% interval (common practice; fixed seed), and zero
        // evolution rejected for both (|a| ≥ 0.75 with σ ≈ 0.05 on 3000 objects).
        var early = result.RequiredEvolution.Single(e => e.Model == "lcdm" && e.Group == "early");
        var late = result.RequiredEvolution.Single(e => e.Model == "lcdm" && e.Group == "late");
        Assert.True(-1.5 >= early.Value - 2 * (early.Value - early.Lo) && -1.5 <= early.Value + 2 * (early.Hi - early.Value), $"a_early = {early.Value}");
        Assert.True(-0.75 >= late.Value - 2 * (late.Value - late.Lo) && -0.75 <= late.Value + 2 * (late.Hi - late.Value), $"a_late = {late.Value}");
        Assert.True(early.ZeroExcluded && late.ZeroExcluded);
        // The static model needs less shrinking than ΛCDM for both groups (its D_A grows without turning over): a closer to 0.
        Assert.True(result.RequiredEvolution.Single(e => e.Model == "static-linear" && e.Group == "early").Value > early.Value);

        // The evolution-test table (report and conclusions) has one row per group, with a per-group symbol and words.
        var rows = EvolutionTestTable.From(result).Where(r => r.Model == "lcdm").ToList();
        Assert.Equal(["a[early]", "a[late]"], rows.Select(r => r.Symbol));
        Assert.Equal("size evolution of group early", rows[0].What);
        // The combined comparison is stated, and results.json carries each entry's group.
        Assert.Contains(result.Notes, n => n.Contains("one combined comparison over all groups", StringComparison.Ordinal));
        var json = ResultsJson.Serialize(result);
        Assert.Contains("\"group\": \"early\"", json, StringComparison.Ordinal);
    }
}

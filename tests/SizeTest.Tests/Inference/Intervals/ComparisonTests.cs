using SizeTest.Foundation.Errors;
using SizeTest.Cosmology;
using SizeTest.Inference;
using Xunit;
using SizeTest.Inference.Comparison;

namespace SizeTest.Tests.Inference.Intervals;

/// <summary>Paired cross-validation, ties and identifiability (issue 11 item 7, issue 14 identifiability).</summary>
public sealed class ComparisonTests
{
    private static readonly IWorldModel Eds = WorldModels.EinsteinDeSitter.Create(new Dictionary<string, double>());

    [Fact]
    public void IdenticalModelsGiveIdenticalCvScoresAndAZeroPairedDifference()
    {
        var obs = MockCatalogue.Draw(Eds, 300, new MockCatalogue.Truth(), seed: 21);
        var h1 = Hypothesis.Create(WorldModels.EinsteinDeSitter, new NuisanceModel(ObservableKind.Size));
        var h2 = Hypothesis.Create(WorldModels.EinsteinDeSitter, new NuisanceModel(ObservableKind.Size));
        var folds = CrossValidation.AssignFolds(obs.Count, 5, seed: 1);
        var a = CrossValidation.Run(h1, obs, folds, 5) with { Model = "a" };
        var b = CrossValidation.Run(h2, obs, folds, 5) with { Model = "b" };
        // The same likelihood on the same folds is the same computation: equal to the last bit.
        Assert.Equal(a.FoldLogDensities, b.FoldLogDensities);
        Assert.Equal(a.LogPredictiveDensity, b.LogPredictiveDensity);
        var d = Assert.Single(CrossValidationComparison.Compare([a, b]));
        Assert.Equal(0.0, d.Difference);
        Assert.Equal(0.0, d.StandardError);
        Assert.True(d.Tied);
    }

    [Fact]
    public void FoldsDependOnTheSeedOnlyNotOnTheModel()
    {
        // Regression: folds used to be seeded per model (seed + 13 m), so CV differences were not paired.
        Assert.Equal(CrossValidation.AssignFolds(500, 5, 7), CrossValidation.AssignFolds(500, 5, 7));
        Assert.NotEqual(CrossValidation.AssignFolds(500, 5, 7), CrossValidation.AssignFolds(500, 5, 8));
    }

    [Fact]
    public void EinsteinDeSitterAndFlatLcdmWithOmegaMOneTieInTheStudy()
    {
        // Flat ΛCDM with Ωm = 1 is Einstein–de Sitter (closed form vs tables agree to ~1e-13, docs/science.md), so the
        // two fits agree to numerical noise: they must share rank 1, and their paired CV difference is a tie.
        var obs = MockCatalogue.Draw(Eds, 400, new MockCatalogue.Truth(), seed: 4);
        var hs = new[]
        {
            Hypothesis.Create(WorldModels.EinsteinDeSitter, new NuisanceModel(ObservableKind.Size)),
            Hypothesis.Create(WorldModels.LambdaCdm, new NuisanceModel(ObservableKind.Size), new ParameterOverrides(Fixed: new Dictionary<string, double> { ["omega_m"] = 1.0 })),
        };
        var r = FitRun.Run(new FitRequest { Hypotheses = hs, Observables = obs, CrossValidationFolds = 5 });
        Assert.All(r.Models, m => { Assert.Equal(1, m.Rank); Assert.True(m.Tied); });
        Assert.Contains(r.Notes, n => n.Contains("none is ranked first", StringComparison.Ordinal));
        var cv = r.CrossValidation.ToDictionary(c => c.Model);
        for (int f = 0; f < 5; f++) Assert.Equal(cv["eds"].FoldLogDensities[f], cv["lcdm"].FoldLogDensities[f], 1e-6);
        var d = Assert.Single(r.CrossValidationDifferences);
        Assert.True(d.Tied, $"paired difference {d.Difference}");
        Assert.InRange(d.Difference, -1e-6, 1e-6);
    }

    [Fact]
    public void SurfaceBrightnessOnlyWithFreeEvolutionTiesEveryModel()
    {
        // With sb_evolution free, μ constrains only n − b, so every world model reaches the same maximum (issue 11).
        var obs = MockCatalogue.Draw(Eds, 300, new MockCatalogue.Truth(), seed: 9);
        var hs = new[] { WorldModels.EinsteinDeSitter, WorldModels.StaticLinear, WorldModels.LambdaCdm }
            .Select(f => Hypothesis.Create(f, new NuisanceModel(ObservableKind.SurfaceBrightness))).ToArray();
        var r = FitRun.Run(new FitRequest { Hypotheses = hs, Observables = obs });
        Assert.All(r.Models, m => { Assert.Equal(1, m.Rank); Assert.True(m.Tied, $"{m.Name} BIC {m.Bic:R}"); });
    }

    [Fact]
    public void RanksAreSharedOnlyWithinTheTolerance()
    {
        static ModelFitSummary M(string name, double ll) => new()
        {
            Name = name, Parameters = [], LogLikelihood = ll, K = 2, N = 100, Converged = true,
            Aic = InformationCriteria.Aic(ll, 2), Aicc = InformationCriteria.Aicc(ll, 2, 100), Bic = InformationCriteria.Bic(ll, 2, 100),
        };
        // ln L 1e-9 apart: a tie (listed by name); 0.5 apart (ΔBIC = 1): distinct ranks 1 and 3 (competition ranking).
        var ranked = ModelComparison.Rank([M("b", -100.0), M("a", -100.0 + 1e-9), M("c", -100.5)]);
        Assert.Equal(["a", "b", "c"], ranked.Select(m => m.Name));
        Assert.Equal([1, 1, 3], ranked.Select(m => m.Rank));
        Assert.Equal([true, true, false], ranked.Select(m => m.Tied));
    }

    [Fact]
    public void MoreFreeParametersThanObjectsIsRefused()
    {
        var obs = MockCatalogue.Draw(Eds, 3, new MockCatalogue.Truth(), seed: 2);
        var h = Hypothesis.Create(WorldModels.EinsteinDeSitter, new NuisanceModel(ObservableKind.Size)); // k = 3
        var ex = Assert.Throws<InputException>(() => FitRun.Run(new FitRequest { Hypotheses = [h], Observables = obs }));
        Assert.Contains("k = 3", ex.Message, StringComparison.Ordinal);
        Assert.Contains("n = 3", ex.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void FewerThanTenObjectsPerParameterIsWarned()
    {
        var obs = MockCatalogue.Draw(Eds, 25, new MockCatalogue.Truth(), seed: 2);
        var h = Hypothesis.Create(WorldModels.EinsteinDeSitter, new NuisanceModel(ObservableKind.Size));
        var r = FitRun.Run(new FitRequest { Hypotheses = [h], Observables = obs, CrossValidationFolds = 30 });
        Assert.Contains(r.Notes, n => n.StartsWith("warning: n = 25 objects for up to k = 3", StringComparison.Ordinal));
        // Folds above n are capped at leave-one-out with a stated note, never turned off silently.
        Assert.Contains(r.Notes, n => n.Contains("capped at 25 folds", StringComparison.Ordinal));
        Assert.Equal(25, Assert.Single(r.CrossValidation).Folds);
    }
}

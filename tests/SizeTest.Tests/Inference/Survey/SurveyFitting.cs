using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Inference.Survey;
using SizeTest.Photometry;
using SizeTest.Simulation;
using Xunit;

namespace SizeTest.Tests.Inference.Survey;

/// <summary>Shared helpers of the survey-term tests: draw a mock, fit one hypothesis, read an estimate.</summary>
internal static class SurveyFitting
{
    public static global::SizeTest.Simulation.MockCatalogue Draw(IWorldModel model, int n, long seed, string zDist = "uniform:0.1:2", GalaxyPopulation? galaxy = null,
        MeasurementErrors? errors = null, MockSelection? selection = null, SurveyPopulation? survey = null,
        MockObjectKind kind = MockObjectKind.Galaxy, RadioSourcePopulation? radio = null)
    {
        Assert.True(RedshiftDistribution.TryParse(zDist, out var dist, out var err), err);
        var design = new SurveyDesign(n, dist!, kind, errors ?? new MeasurementErrors(), selection);
        return MockSurveyGenerator.Generate(new MockSurveySpec(model, design, seed, galaxy, radio, survey), parallel: false);
    }

    public static (ModelFitSummary Summary, HypothesisLikelihood Likelihood) Fit(IWorldModelFamily family, Observables obs, SurveyModel? survey,
        ParameterOverrides? overrides = null)
    {
        var h = Hypothesis.Create(family, new NuisanceModel(ObservableKind.Size, Survey: survey), overrides);
        var lik = h.Bind(obs);
        var fit = MaximumLikelihood.Fit(lik);
        Assert.True(fit.Converged, fit.ExitReason.Text);
        return (FitSummaries.From(lik, fit), lik);
    }

    public static ParameterEstimate Est(ModelFitSummary s, string name) => s.Parameters.Single(p => p.Name == name);

    /// <summary>Whether <paramref name="truth"/> lies within k half-widths of the estimate's interval.</summary>
    public static bool Within(ParameterEstimate e, double truth, double k = 1) =>
        truth >= e.Value - k * (e.Value - e.Lo) && truth <= e.Value + k * (e.Hi - e.Value);
}

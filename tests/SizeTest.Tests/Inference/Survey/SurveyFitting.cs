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
    /// <summary>The flat ΛCDM the mocks are drawn in (H0 = 70, Ωm = 0.3).</summary>
    public static IWorldModel Lcdm { get; } = new LambdaCdmModel(70, 0.3);

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

    /// <summary>
    /// Asserts that <paramref name="lik"/>'s analytic gradient matches Richardson-extrapolated central differences
    /// (<see cref="GradientTests.FiniteDifference"/>) within <paramref name="tolerance"/> (|FD| + 1) at <see cref="GradientTests.OffMaximum"/>.
    /// </summary>
    public static void AssertGradientMatches(HypothesisLikelihood lik, double tolerance, string label)
    {
        var t = GradientTests.OffMaximum(lik);
        var fp = lik.Hypothesis.FreeParameters;
        var analytic = new double[t.Length];
        double v = lik.LogDensityAndGradient(t, analytic);
        Assert.True(double.IsFinite(v), $"{label}: ln L = {v}");
        Assert.Equal(lik.LogDensity(t), v, 9);
        var fd = GradientTests.FiniteDifference(lik, t);
        for (int j = 0; j < t.Length; j++)
            Assert.True(Math.Abs(analytic[j] - fd[j]) <= tolerance * (Math.Abs(fd[j]) + 1),
                $"{label}: {fp[j].Name}: analytic {analytic[j]:R}, finite difference {fd[j]:R}");
    }

    public static ParameterEstimate Est(ModelFitSummary s, string name) => s.Parameters.Single(p => p.Name == name);

    /// <summary>Whether <paramref name="truth"/> lies within k half-widths of the estimate's interval.</summary>
    public static bool Within(ParameterEstimate e, double truth, double k = 1) =>
        truth >= e.Value - k * (e.Value - e.Lo) && truth <= e.Value + k * (e.Hi - e.Value);
}

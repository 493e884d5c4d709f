using SizeTest.Cosmology;
using SizeTest.Inference;
using Xunit;

namespace SizeTest.Tests.Inference;

/// <summary>
/// The typed exit reason of a fit: the deciding cause follows the first failed check of
/// <c>MaximumLikelihood.Fit</c>,
/// and results.json keeps the sentence and the one spelling of observable and sampler.
/// </summary>
public sealed class ExitReasonTests
{
    private sealed class Density(Func<double, double> f, Func<double, double> df) : ILogDensityWithGradient
    {
        public int Dimension => 1;
        public double LogDensity(ReadOnlySpan<double> theta) => f(theta[0]);
        public double LogDensityAndGradient(ReadOnlySpan<double> theta, Span<double> gradient)
        {
            gradient[0] = df(theta[0]);
            return f(theta[0]);
        }
    }

    private static readonly ParameterSetting X =
        ParameterSetting.Free(new ParameterSpec("x", "x", "", 0.3, -5, 5, "a test coordinate"));

    private static MaximumLikelihoodResult Fit(Density d) => MaximumLikelihood.Fit(d, d, [X], [0.3]);

    [Fact]
    public void AGaussianConverges()
    {
        // ln p = −(x − 1)²/2: a unit Gaussian, maximum at x = 1, curvature −1 (closed form).
        var fit = Fit(new Density(x => -0.5 * (x - 1) * (x - 1), x => -(x - 1)));
        Assert.True(fit.Converged, fit.ExitReason.Text);
        Assert.Equal(ExitCause.Converged, fit.ExitReason.Cause);
        Assert.StartsWith("converged: L-BFGS-B", fit.ExitReason.Text, StringComparison.Ordinal);
        Assert.Equal(1.0, fit.Theta[0], 6);
    }

    [Fact]
    public void AFlatDensityFailsOnItsCurvature()
    {
        // ln p = 0: zero gradient (the optimiser stops at once) and zero curvature, which is not negative definite.
        var fit = Fit(new Density(_ => 0, _ => 0));
        Assert.False(fit.Converged);
        Assert.Equal(ExitCause.CurvatureNotDefinite, fit.ExitReason.Cause);
        Assert.StartsWith("not converged: ", fit.ExitReason.Text, StringComparison.Ordinal);
    }

    [Fact]
    public void ANowhereFiniteDensityIsNamed()
    {
        var fit = Fit(new Density(_ => double.NaN, _ => double.NaN));
        Assert.False(fit.Converged);
        Assert.Equal(ExitCause.LikelihoodNotFinite, fit.ExitReason.Cause);
        Assert.Contains("not finite", fit.ExitReason.Text, StringComparison.Ordinal);
    }

    [Fact]
    public void AFailureAfterConvergenceDecidesAndClausesJoinWithSemicolons()
    {
        var r = new ExitReason(ExitCause.Converged, "converged: a").And("at a bound: x").And(ExitCause.SamplerNotConverged, "mcmc: b");
        Assert.Equal(ExitCause.SamplerNotConverged, r.Cause);
        Assert.Equal("converged: a; at a bound: x; mcmc: b", r.Text);
        var kept = new ExitReason(ExitCause.OptimiserStopped, "not converged: a").And(ExitCause.SamplerNotConverged, "b");
        Assert.Equal(ExitCause.OptimiserStopped, kept.Cause);
    }

    [Fact]
    public void ResultsJsonKeepsTheSentenceAndTheSpellings()
    {
        var result = new FitResult
        {
            Source = "hand-made", RowsRead = 1, Accepted = 1, Rejected = 0, Seed = 1,
            Settings = new FitSettings(ObservableKind.SurfaceBrightness, new SelectionLimits(), false, 5, 0, 0, 1, 0, 0, SamplerKind.Nested, 0, 0, 0, null, [], 1),
            Models = [new ModelFitSummary { Name = "eds", Parameters = [], LogLikelihood = -1, K = 1, N = 1, Aic = 4, Aicc = 4, Bic = 2, Converged = false, ExitReason = new ExitReason(ExitCause.OptimiserStopped, ["not converged: a", "b"]) }],
        };
        string json = ResultsJson.Serialize(result);
        // The spellings of the command line (--observable sb, --sampler nested), not the enum names.
        Assert.Contains("\"observable\": \"sb\"", json, StringComparison.Ordinal);
        Assert.Contains("\"sampler\": \"nested\"", json, StringComparison.Ordinal);
        Assert.Contains("\"exit_reason\": \"not converged: a; b\"", json, StringComparison.Ordinal);
        var back = ResultsJson.Deserialize(json);
        Assert.Equal(ObservableKind.SurfaceBrightness, back.Settings.Observable);
        Assert.Equal(SamplerKind.Nested, back.Settings.Sampler);
        Assert.Equal("not converged: a; b", back.Models[0].ExitReason.Text);
        Assert.Equal(ExitCause.Recorded, back.Models[0].ExitReason.Cause);
        Assert.Throws<System.Text.Json.JsonException>(() => ResultsJson.Deserialize(json.Replace("\"sb\"", "\"surface_brightness\"", StringComparison.Ordinal)));
    }
}

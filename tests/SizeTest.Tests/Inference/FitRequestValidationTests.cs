using SizeTest.Cosmology;
using SizeTest.Foundation.Errors;
using SizeTest.Inference;
using SizeTest.Photometry;
using Xunit;

namespace SizeTest.Tests.Inference;

/// <summary>
/// <see cref="FitRequest.Validate"/> names settings, never command-line flags (issue 15: messages from inner
/// stages name the setting; the CLI maps it to its flag, <c>Approved/bad-input-fit.txt</c>). The limits are the
/// documented ones: ≥ 1 start, ≥ 0 resamples, 0 or ≥ 2 folds, ≥ 4 walkers, ≥ 10 steps (0: auto), max steps and live points.
/// </summary>
public sealed class FitRequestValidationTests
{
    private static FitRequest Request() => new()
    {
        Hypotheses = [Hypothesis.Create(WorldModels.Get("eds"), new NuisanceModel(ObservableKind.Size))],
        Observables = new Observables([]),
    };

    [Fact]
    public void TheDefaultsHaveNoProblems() => Assert.Empty(Request().Validate());

    [Theory]
    [InlineData("bootstrap", "bootstrap must be 0 or more")]
    [InlineData("cv_folds", "cv_folds must be 0 (none) or at least 2")]
    [InlineData("starts", "starts must be at least 1")]
    [InlineData("walkers", "walkers needs at least 4, steps and live_points at least 10")]
    [InlineData("steps", "walkers needs at least 4, steps and live_points at least 10")]
    [InlineData("live_points", "walkers needs at least 4, steps and live_points at least 10")]
    [InlineData("max_steps", "max_steps must be at least 10")]
    public void EachBadSettingIsNamed(string setting, string message)
    {
        var r = Request();
        r = setting switch
        {
            "bootstrap" => r with { Bootstrap = -1 },
            "cv_folds" => r with { CrossValidationFolds = 1 },
            "starts" => r with { Starts = 0 },
            "walkers" => r with { Walkers = 3 },
            "steps" => r with { Steps = 9 },
            "live_points" => r with { LivePoints = 9 },
            _ => r with { MaxSteps = 9 },
        };
        var problem = Assert.Single(r.Validate());
        Assert.Equal(message, problem.ToString());
        Assert.Contains(setting, problem.Settings);
        Assert.DoesNotContain("--", problem.ToString());
        var e = Assert.Throws<InputException>(() => FitRun.Run(r));
        Assert.Equal(message, e.Message);
        Assert.Equal(problem, Assert.Single(e.SettingProblems));
    }

    [Fact]
    public void AutoStepsAreNotAProblem() => Assert.Empty((Request() with { Steps = 0, Sampler = SamplerKind.Mcmc }).Validate());
}

using SizeTest.Catalogues;
using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Photometry;
using SizeTest.Tests.Distributed;
using Xunit;

namespace SizeTest.Tests.Inference;

/// <summary>Sizes read in the wrong unit by a factor 60 give a fitted R0 no real object has, and the fit says so.</summary>
public sealed class PhysicalSizePlausibilityTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-r0check-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private static FitResult Fit(Observables obs) => FitRun.Run(new FitRequest
    {
        Hypotheses =
        [
            Hypothesis.Create(WorldModels.LambdaCdm, new NuisanceModel(ObservableKind.Size)),
            Hypothesis.Create(WorldModels.StaticLinear, new NuisanceModel(ObservableKind.Size)),
        ],
        Observables = obs, Source = "mock", Starts = 2, CrossValidationFolds = 0,
    });

    [Fact]
    public void AFactorSixtyInTheSizesIsNamedAndTheRightUnitIsQuiet()
    {
        var obs = ObservablesBuilder.Build(CatalogueLoader.Load(DistributedFitCatalogues.Csv(_dir, 1500)).Rows, PhotometryOptions.Default).Observables;
        // The same objects with every θ 60 times larger (arcmin values read as arcsec): ln θ + ln 60, fractional errors kept.
        var slipped = new Observables(obs.Z, obs.LnTheta!.Select(y => y + Math.Log(60)).ToArray(), obs.LnThetaErr);
        var right = Fit(obs);
        var wrong = Fit(slipped);
        double R0(FitResult r, string model) => r.Models.First(m => m.Name == model).Parameters.First(p => p.Name == "r0_kpc").Value;
        foreach (var model in new[] { "lcdm", "static-linear" })
        {
            // θ ∝ R0 at fixed cosmology, so R0 scales by exactly 60 (closed form; optimiser tolerance 1e-4 relative).
            Assert.Equal(60, R0(wrong, model) / R0(right, model), 60 * 1e-4);
            Assert.InRange(R0(right, model), PhysicalSizePlausibility.MinKpc, PhysicalSizePlausibility.MaxKpc);
        }
        Assert.DoesNotContain(right.Notes, n => n.Contains("physical size scale"));
        Assert.Contains(wrong.Notes, n => n.Contains("larger than any galaxy") && n.Contains("factor 60"));
    }

    [Fact]
    public void OneModelWithAnOddScaleAloneIsNotFlagged()
    {
        ModelFitSummary Summary(string name, double r0) => new()
        {
            Name = name, Parameters = [new ParameterEstimate("r0_kpc", r0, r0, r0, false, "kpc", IntervalMethods.Hessian)],
            LogLikelihood = 0, K = 1, N = 10, Aic = 0, Aicc = 0, Bic = 0, Converged = true,
        };
        Assert.Null(PhysicalSizePlausibility.Note([Summary("a", 300), Summary("b", 50)]));
        Assert.NotNull(PhysicalSizePlausibility.Note([Summary("a", 300), Summary("b", 150)]));
        Assert.NotNull(PhysicalSizePlausibility.Note([Summary("a", 2e-4)]));
    }
}

using SizeTest.Catalogues;
using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Photometry;
using SizeTest.Tests.Distributed;
using Xunit;

namespace SizeTest.Tests.Inference;

/// <summary>With a sampler on, every number and note of one model describes the same reported point and intervals.</summary>
public sealed class SampledSummaryConsistencyTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-sampled-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    [Fact]
    public void ADerivedParameterFollowsThePosteriorMediansAndNoNoteClaimsProfileIntervals()
    {
        var path = DistributedFitCatalogues.Csv(_dir, 800);
        var obs = ObservablesBuilder.Build(CatalogueLoader.Load(path).Rows, PhotometryOptions.Default).Observables;
        var h = Hypothesis.Create(WorldModels.LambdaCdm, new NuisanceModel(ObservableKind.Size), new ParameterOverrides(Free: new HashSet<string> { "omega_m" }));
        var result = FitRun.Run(new FitRequest
        {
            Hypotheses = [h], Observables = obs, Source = "mock", Starts = 2, CrossValidationFolds = 0,
            Sampler = SamplerKind.Mcmc, Walkers = 16, Steps = 400,
        });
        var p = result.Models[0].Parameters.ToDictionary(e => e.Name);
        Assert.Equal(IntervalMethods.Posterior, p["omega_m"].IntervalMethod);
        // Flat ΛCDM: Ω_Λ = 1 − Ω_m (closed form); the reported Ω_Λ must belong to the reported Ω_m (the posterior median),
        // not to the maximum-likelihood point (before the fix it was 1 − Ω_m of the maximum).
        Assert.Equal(1 - p["omega_m"].Value, p["omega_lambda"].Value, 12);
        // The intervals are posterior percentiles, so no note may say the profile interval is the one reported.
        Assert.DoesNotContain(result.Notes, n => n.Contains("so the profile interval is reported") || n.Contains("are profile-likelihood intervals"));
    }
}

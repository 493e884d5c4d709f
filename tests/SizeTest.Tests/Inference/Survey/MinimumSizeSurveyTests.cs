using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Inference.Survey;
using SizeTest.Photometry;
using SizeTest.Simulation;
using Xunit;
using static SizeTest.Tests.Inference.Survey.SurveyFitting;

namespace SizeTest.Tests.Inference.Survey;

/// <summary>
/// Injection–recovery of the --min-size truncation combined with the survey terms (size–luminosity relation, Gaussian size
/// errors, photometric redshifts): each density is divided by P(θ_obs &gt; θ_min | z) under the same size model.
/// </summary>
public sealed class MinimumSizeSurveyTests(Xunit.Abstractions.ITestOutputHelper output)
{
    private static readonly IWorldModel Lcdm = new LambdaCdmModel(70, 0.3);

    private static ModelFitSummary FitCut(Observables obs, SurveyModel survey, double? minTheta)
    {
        var h = Hypothesis.Create(WorldModels.LambdaCdm,
            new NuisanceModel(ObservableKind.Size, minTheta is { } t ? new SelectionLimits(MinThetaArcsec: t) : null, Survey: survey));
        var lik = h.Bind(obs);
        var fit = MaximumLikelihood.Fit(lik);
        Assert.True(fit.Converged, fit.ExitReason.Text);
        return FitSummaries.From(lik, fit);
    }

    [Fact]
    [Trait("Category", "Slow")]
    public void SizeLuminosityRelationWithAMinimumSizeRecoversEvolutionAndSlope()
    {
        // Injection: flat ΛCDM (H0 = 70, Ωm = 0.3), Schechter LF (M* = −21, α = −1.2), R = 5 kpc (L/L(−21))^0.3 (1+z)^−1 with
        // 0.2 dex scatter and 5% log-normal errors, 0.1 < z < 2, kept if m < 24 and θ_obs > 0.5″ (a resolution limit).
        var mock = Draw(Lcdm, 3000, seed: 41, errors: new MeasurementErrors(0.05, MuErrorMag: 0.0), selection: new MockSelection(MagLimit: 24, MinThetaArcsec: 0.5),
            survey: new SurveyPopulation(new SchechterLuminosityFunction(), SizeLuminositySlope: 0.3));
        var obs = mock.ToObservables();
        var relation = new SurveyModel(SizeRelationKind.Luminosity);
        var cut = FitCut(obs, relation, 0.5);
        var a = Est(cut, "size_evolution");
        var beta = Est(cut, "size_luminosity_slope");
        output.WriteLine($"n = {obs.Count}; truncated: a = {a.Value:F3} [{a.Lo:F3}, {a.Hi:F3}], beta = {beta.Value:F3} [{beta.Lo:F3}, {beta.Hi:F3}]");
        // Within 2 half-widths of the 68% interval (a 2σ miss has probability 5%; the seed is fixed) — common practice.
        Assert.True(Within(a, -1.0, 2), $"a = {a.Value} [{a.Lo}, {a.Hi}]");
        Assert.True(Within(beta, 0.3, 2), $"beta = {beta.Value} [{beta.Lo}, {beta.Hi}]");

        // Without the truncation the small, faint objects lost at high z pull a upwards: measurably biased (> 5σ).
        var a0 = Est(FitCut(obs, relation, null), "size_evolution");
        output.WriteLine($"untruncated: a = {a0.Value:F3} [{a0.Lo:F3}, {a0.Hi:F3}]");
        Assert.True(a0.Value - -1.0 > 5 * (a0.Hi - a0.Value), $"a without truncation = {a0.Value} [{a0.Lo}, {a0.Hi}]");
    }

    [Fact]
    [Trait("Category", "Slow")]
    public void GaussianSizeErrorsWithAMinimumSizeRecoverTheEvolution()
    {
        // Injection: R = 5 kpc (1+z)^−1, 0.2 dex scatter, Gaussian θ errors of 10% → 40% of the median size over z = 0.1–2,
        // kept if θ_obs > 0.4″. P(θ_obs > θ_min) is ∫ Φ((e^u − θ_min)/σ_θ) N(u; m, σ²) du.
        var mock = Draw(Lcdm, 3000, seed: 43, errors: new MeasurementErrors(0.1, MuErrorMag: 0, SizeErrors: SizeErrorModel.Gaussian, SizeErrorFractionAtZMax: 0.4),
            selection: new MockSelection(MinThetaArcsec: 0.4));
        var obs = mock.ToObservables();
        var sv = new SurveyModel(SizeErrors: SizeErrorKind.Gaussian);
        var a = Est(FitCut(obs, sv, 0.4), "size_evolution");
        var a0 = Est(FitCut(obs, sv, null), "size_evolution");
        output.WriteLine($"n = {obs.Count}; truncated: a = {a.Value:F3} [{a.Lo:F3}, {a.Hi:F3}]; untruncated: a = {a0.Value:F3} [{a0.Lo:F3}, {a0.Hi:F3}]");
        Assert.True(Within(a, -1.0, 2), $"a = {a.Value} [{a.Lo}, {a.Hi}]");
        Assert.True(a0.Value - -1.0 > 5 * (a0.Hi - a0.Value), $"a without truncation = {a0.Value} [{a0.Lo}, {a0.Hi}]");
    }

    [Fact]
    [Trait("Category", "Slow")]
    public void PhotometricRedshiftsWithAMinimumSizeRecoverTheEvolution()
    {
        // Injection: R = 5 kpc (1+z)^−1, 0.2 dex scatter, 5% log-normal errors, z_true uniform on [0.3, 2], σ_z = 0.05 (1+z),
        // kept if θ_obs > 0.4″. The truncation is applied at every node of the redshift integral.
        var mock = Draw(Lcdm, 3000, seed: 47, zDist: "uniform:0.3:2", errors: new MeasurementErrors(0.05, MuErrorMag: 0, PhotoZError: 0.05),
            selection: new MockSelection(MinThetaArcsec: 0.4));
        var obs = mock.ToObservables();
        var sv = new SurveyModel(MarginaliseRedshift: true, RedshiftPriorMin: 0.3, RedshiftPriorMax: 2);
        var a = Est(FitCut(obs, sv, 0.4), "size_evolution");
        var a0 = Est(FitCut(obs, sv, null), "size_evolution");
        output.WriteLine($"n = {obs.Count}; truncated: a = {a.Value:F3} [{a.Lo:F3}, {a.Hi:F3}]; untruncated: a = {a0.Value:F3} [{a0.Lo:F3}, {a0.Hi:F3}]");
        Assert.True(Within(a, -1.0, 2), $"a = {a.Value} [{a.Lo}, {a.Hi}]");
        Assert.True(a0.Value - -1.0 > 5 * (a0.Hi - a0.Value), $"a without truncation = {a0.Value} [{a0.Lo}, {a0.Hi}]");
    }
}

using SizeTest.Cosmology;
using SizeTest.Inference.Survey;
using SizeTest.Simulation;
using Xunit;
using static SizeTest.Tests.Inference.Survey.SurveyFitting;

namespace SizeTest.Tests.Inference.Survey;

public sealed class SizeLuminosityRecoveryTests(Xunit.Abstractions.ITestOutputHelper output)
{
    private static readonly IWorldModel Lcdm = new LambdaCdmModel(70, 0.3);

    [Fact]
    public void MagnitudeLimitedMockRecoversEvolutionAndSlopeAndTheFitWithoutTheRelationIsBiased()
    {
        // Injection: flat ΛCDM (H0 = 70, Ωm = 0.3), Schechter LF (M* = −21, α = −1.2, −24 < M < −16), R = 5 kpc (L/L(−21))^0.3
        // (1+z)^−1 with 0.2 dex scatter, 0.1 < z < 2, kept only if m < 24 (the setting of issue 12, which measured a ≈ −0.59 without
        // the relation). The size likelihood conditions on each object's luminosity, so a selection on m alone does not bias it.
        var mock = Draw(Lcdm, 2000, seed: 12, errors: new MeasurementErrors(0.05, MuErrorMag: 0.0), selection: new MockSelection(MagLimit: 24),
            survey: new SurveyPopulation(new SchechterLuminosityFunction(), SizeLuminositySlope: 0.3));
        var obs = mock.ToObservables();
        var (with, _) = Fit(WorldModels.LambdaCdm, obs, new SurveyModel(SizeRelationKind.Luminosity));
        var a = Est(with, "size_evolution");
        var beta = Est(with, "size_luminosity_slope");
        output.WriteLine($"with relation: a = {a.Value:F3} [{a.Lo:F3}, {a.Hi:F3}], beta = {beta.Value:F3} [{beta.Lo:F3}, {beta.Hi:F3}]");
        // Within 2 half-widths of the 68% interval (a 2σ miss has probability 5%; the seed is fixed) — common practice.
        Assert.True(Within(a, -1.0, 2), $"a = {a.Value} [{a.Lo}, {a.Hi}]");
        Assert.True(Within(beta, 0.3, 2), $"beta = {beta.Value} [{beta.Lo}, {beta.Hi}]");

        var (without, _) = Fit(WorldModels.LambdaCdm, obs, null);
        var a0 = Est(without, "size_evolution");
        output.WriteLine($"without relation: a = {a0.Value:F3} [{a0.Lo:F3}, {a0.Hi:F3}]");
        // The brighter, larger galaxies that survive m < 24 at high z pull a upwards: measurably biased (> 5σ from the truth).
        Assert.True(a0.Value - -1.0 > 5 * (a0.Hi - a0.Value), $"a without relation = {a0.Value} [{a0.Lo}, {a0.Hi}]");
    }
}

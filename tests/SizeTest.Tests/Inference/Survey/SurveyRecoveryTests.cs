using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Inference.Survey;
using SizeTest.Simulation;
using Xunit;
using static SizeTest.Tests.Inference.Survey.SurveyFitting;

namespace SizeTest.Tests.Inference.Survey;

/// <summary>Injection–recovery for the radio form, populations, binned evolution and the size-error models.</summary>
public sealed class SurveyRecoveryTests(Xunit.Abstractions.ITestOutputHelper output)
{
    private static readonly IWorldModel Lcdm = new LambdaCdmModel(70, 0.3);

    [Fact]
    public void RadioMockRecoversTheCompactSourceRodFromFluxDensities()
    {
        // Truth: ℓ = ℓ_m (L/10^27 W/Hz)^0.1 (1+z)^0, ℓ_m = 11.03 pc (Cao et al. 2017, A&A 606, A15), 0.1 dex scatter, flat ΛCDM;
        // the catalogue carries flux densities, and every model computes L_ν = 4π D_L² S_ν (its own D_L).
        var mock = Draw(Lcdm, 1500, seed: 5, zDist: "uniform:0.4:2.8", kind: MockObjectKind.CompactRadio,
            radio: new RadioSourcePopulation(LuminosityExponent: 0.1), errors: new MeasurementErrors(0.05, MuErrorMag: 0));
        var (s, _) = Fit(WorldModels.LambdaCdm, mock.ToObservables(), new SurveyModel(SizeRelationKind.Luminosity));
        var r0 = Est(s, "r0_kpc");
        var beta = Est(s, "size_luminosity_slope");
        var n = Est(s, "size_evolution");
        output.WriteLine($"l_m = {1000 * r0.Value:F3} pc [{1000 * r0.Lo:F3}, {1000 * r0.Hi:F3}], beta = {beta.Value:F3}, n = {n.Value:F3} [{n.Lo:F3}, {n.Hi:F3}]");
        // ℓ_m (pc) = 1000 · r0_kpc: within 2 half-widths of its 68% interval (common practice), and β, n likewise.
        Assert.True(Within(r0, 11.03e-3, 2), $"l_m = {r0.Value * 1000} pc");
        Assert.True(Within(beta, 0.1, 2), $"beta = {beta.Value}");
        Assert.True(Within(n, 0.0, 2), $"n = {n.Value}");
    }

    [Fact]
    public void TwoPopulationMockRecoversEachGroupsEvolutionWithOneSharedOmegaM()
    {
        // Truth: early 40% R0 = 3 kpc, a = −1.5, 0.15 dex; late 60% R0 = 6 kpc, a = −0.75, 0.2 dex (van der Wel et al. 2014's
        // early/late exponents at fixed luminosity, rounded); flat ΛCDM Ωm = 0.3 shared.
        var pops = new[] { new MockSubpopulation("early", 0.4, 3, -1.5, 0, 0.15), new MockSubpopulation("late", 0.6, 6, -0.75, 0, 0.2) };
        var mock = Draw(Lcdm, 6000, seed: 3, zDist: "uniform:0.05:3", survey: new SurveyPopulation(Populations: pops), errors: new MeasurementErrors(0.05, MuErrorMag: 0));
        var (s, _) = Fit(WorldModels.LambdaCdm, mock.ToObservables(), new SurveyModel(Groups: ["early", "late"]),
            new ParameterOverrides(Free: new HashSet<string> { "omega_m" }));
        var om = Est(s, "omega_m");
        var ae = Est(s, "size_evolution@early");
        var al = Est(s, "size_evolution@late");
        output.WriteLine($"omega_m = {om.Value:F3} [{om.Lo:F3}, {om.Hi:F3}], a_early = {ae.Value:F3} [{ae.Lo:F3}, {ae.Hi:F3}], a_late = {al.Value:F3} [{al.Lo:F3}, {al.Hi:F3}]");
        Assert.True(Within(ae, -1.5, 2), $"a_early = {ae.Value}");
        Assert.True(Within(al, -0.75, 2), $"a_late = {al.Value}");
        Assert.True(Within(om, 0.3, 2), $"omega_m = {om.Value}");
        Assert.Equal(1, s.Parameters.Count(p => p.Name == "omega_m"));
    }

    [Fact]
    public void BinnedEvolutionReproducesThePowerLawWithinItsIntervals()
    {
        // Truth: R = 5 kpc (1+z)^−1. A bin's R0 estimates exp(mean ln R) of its objects, i.e. 5 exp(−⟨ln(1+z)⟩_bin) (derived:
        // the log-normal mean of ln R is linear in ln(1+z), so the bin average is that of ln(1+z)).
        var mock = Draw(Lcdm, 3000, seed: 9, zDist: "uniform:0.1:3", errors: new MeasurementErrors(0.05, MuErrorMag: 0));
        var obs = mock.ToObservables();
        var edges = SurveyModel.EqualCountEdges(obs.Z, 4);
        var (s, _) = Fit(WorldModels.LambdaCdm, obs, new SurveyModel(EvolutionBinEdges: edges));
        for (int k = 0; k < 4; k++)
        {
            var inBin = obs.Z.Where(z => z >= edges[k] && (k == 3 ? z <= edges[k + 1] : z < edges[k + 1])).ToArray();
            double expected = 5 * Math.Exp(-inBin.Average(z => Math.Log(1 + z)));
            var r = Est(s, $"r0_kpc_bin{k + 1}");
            output.WriteLine($"bin {k + 1}: R0 = {r.Value:F3} [{r.Lo:F3}, {r.Hi:F3}], power law {expected:F3}");
            Assert.True(Within(r, expected, 2), $"bin {k + 1}: {r.Value} vs {expected}");
        }
    }

    [Fact]
    public void GaussianThetaErrorModelRemovesTheBiasOfTheLogNormalApproximation()
    {
        // Errors Gaussian in θ growing linearly from 5% at z = 0.1 to 50% at z = 3 of the median size (issue 12 measured
        // a = −1.113 ± 0.011 against a truth of −1 with the log-normal approximation).
        var errors = new MeasurementErrors(0.05, MuErrorMag: 0, SizeErrors: SizeErrorModel.Gaussian, SizeErrorFractionAtZMax: 0.5);
        var mock = Draw(Lcdm, 4000, seed: 2, zDist: "uniform:0.1:3", errors: errors);
        var obs = mock.ToObservables();
        var (ln, _) = Fit(WorldModels.LambdaCdm, obs, null);
        var (ga, _) = Fit(WorldModels.LambdaCdm, obs, new SurveyModel(SizeErrors: SizeErrorKind.Gaussian));
        var a0 = Est(ln, "size_evolution");
        var a1 = Est(ga, "size_evolution");
        output.WriteLine($"log-normal model: a = {a0.Value:F3} [{a0.Lo:F3}, {a0.Hi:F3}]; gaussian model: a = {a1.Value:F3} [{a1.Lo:F3}, {a1.Hi:F3}]");
        Assert.True(Within(a1, -1.0, 2), $"gaussian a = {a1.Value}");
        Assert.False(Within(a0, -1.0, 3), $"log-normal a = {a0.Value} should be biased");
        Assert.NotNull(SizeErrorCheck.LargeErrorWarning(obs, SizeErrorKind.LogNormal));
    }

    [Fact]
    public void NeitherModelIsExactWhenErrorsAreAFractionOfEachObjectsOwnSize()
    {
        // Issue 12's situation: σ_θ = f θ_true with f growing linearly from 5% at z = 0.1 to 50% at z = 3 (the issue measured
        // a = −1.113 ± 0.011 with the log-normal approximation against a truth of −1).
        var errors = new MeasurementErrors(0.05, MuErrorMag: 0, SizeErrors: SizeErrorModel.GaussianOwnSize, SizeErrorFractionAtZMax: 0.5);
        var mock = Draw(Lcdm, 4000, seed: 2, zDist: "uniform:0.1:3", errors: errors);
        var obs = mock.ToObservables();
        var (ln, _) = Fit(WorldModels.LambdaCdm, obs, null);
        var (ga, _) = Fit(WorldModels.LambdaCdm, obs, new SurveyModel(SizeErrors: SizeErrorKind.Gaussian));
        var a0 = Est(ln, "size_evolution");
        var a1 = Est(ga, "size_evolution");
        output.WriteLine($"own-size errors: log-normal model a = {a0.Value:F3} [{a0.Lo:F3}, {a0.Hi:F3}]; gaussian model a = {a1.Value:F3} [{a1.Lo:F3}, {a1.Hi:F3}]");
        // Measured here (seed 2): log-normal a ≈ −0.89, Gaussian a ≈ −1.23. The Gaussian model takes σ_θ as known and independent of
        // θ_true; with σ_θ = f θ_true the quoted error carries information on θ_true, so it overcorrects. Truth a = −1: both miss it by
        // more than 3 half-widths of their 68% intervals, on opposite sides (common practice for "biased").
        Assert.False(Within(a0, -1.0, 3), $"log-normal a = {a0.Value} should be biased");
        Assert.False(Within(a1, -1.0, 3), $"gaussian a = {a1.Value} should be biased");
        Assert.True(a0.Value > -1.0 && a1.Value < -1.0, $"log-normal {a0.Value}, gaussian {a1.Value}");
    }

    [Theory]
    // The same growth of errors as above (5% → 50% over z = 0.1–3), but log-normal: the default model is exact and recovers a.
    [InlineData(0.0, 0.5, 4000, 2)]
    // A 0.1" floor on 5 kpc (1+z)^−1 galaxies at z = 0.1–3 (θ_med ≈ 0.3–1.3"): σ_ln reaches ~0.33 at high z. The generator
    // takes the floor at the population's median size at z, so the quoted error tells nothing of θ_true and the log-normal
    // likelihood (σ_i known, ancillary) is exact. With the floor taken from θ_true instead (the generator before 2026-12-03)
    // this mock gave a = −0.831 [−0.849, −0.814]: small objects got large σ_i and were down-weighted.
    [InlineData(0.1, double.NaN, 8000, 4)]
    public void LogNormalModelStaysExactForLogNormalErrors(double floorArcsec, double fracAtZMax, int n, long seed)
    {
        var errors = new MeasurementErrors(0.05, floorArcsec, MuErrorMag: 0, SizeErrorFractionAtZMax: double.IsNaN(fracAtZMax) ? null : fracAtZMax);
        var mock = Draw(Lcdm, n, seed, zDist: "uniform:0.1:3", errors: errors);
        var (ln, _) = Fit(WorldModels.LambdaCdm, mock.ToObservables(), null);
        var a = Est(ln, "size_evolution");
        output.WriteLine($"log-normal mock (floor {floorArcsec}\"), log-normal model: a = {a.Value:F3} [{a.Lo:F3}, {a.Hi:F3}]");
        // Truth a = −1 within 2 half-widths of the 68% interval (common practice).
        Assert.True(Within(a, -1.0, 2), $"a = {a.Value}");
    }
}

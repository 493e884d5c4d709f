using CsCheck;
using SizeTest.Foundation.Errors;
using SizeTest.Inference;
using SizeTest.Photometry;
using Xunit;

namespace SizeTest.Tests.Inference;

public sealed class LikelihoodTests
{
    private static readonly NuisanceModel SizeOnly = new(ObservableKind.Size);

    [Fact]
    public void SizeLikelihoodMatchesHandComputedGaussian()
    {
        // Static d = cz/H0 with H0 = 70: D_A = 4282.749400 z Mpc (c/H0, docs/science.md §2.4).
        // Two objects; R0 = 5 kpc, a = 0 (start values), σ_int = 0.2 dex.
        var obs = new Observables([0.5, 1.0], [Math.Log(2e-6), Math.Log(1e-6)], [0.1, 0.0]);
        var h = Hypothesis.Create(TestWorldModels.StaticLinear, SizeOnly, new ParameterOverrides(Fixed: new Dictionary<string, double> { ["r0_kpc"] = 5, ["size_evolution"] = 0, ["scatter_dex"] = 0.2 }));
        var lik = h.Bind(obs);
        double dh = TestWorldModels.C / 70, s2 = Math.Pow(Math.Log(10) * 0.2, 2);
        double expected = 0;
        foreach (var (z, y, e) in new[] { (0.5, Math.Log(2e-6), 0.1), (1.0, Math.Log(1e-6), 0.0) })
        {
            double m = Math.Log(5e-3 / (dh * z)), v = e * e + s2;
            expected += -0.5 * (y - m) * (y - m) / v - 0.5 * Math.Log(2 * Math.PI * v); // Gaussian log density (common practice)
        }
        Assert.Equal(expected, lik.LogDensity([]), 10);
    }

    [Fact]
    public void SurfaceBrightnessLikelihoodUsesTolmanDimmingAndCorrections()
    {
        // μ model = μ0 + 2.5 (n − b) log10(1+z) + K + A (Tolman 1930; Observables remarks); EdS has n = 4.
        var obs = new Observables([1.0], mu: [24.5], muErr: [0.2], kCorrection: [0.3], extinction: [0.1]);
        var h = Hypothesis.Create(TestWorldModels.Eds, new NuisanceModel(ObservableKind.SurfaceBrightness),
            new ParameterOverrides(Fixed: new Dictionary<string, double> { ["mu0"] = 21, ["sb_evolution"] = 1, ["scatter_mag"] = 0.3 }));
        double m = 21 + 2.5 * 3 * Math.Log10(2) + 0.4, v = 0.04 + 0.09;
        Assert.Equal(-0.5 * (24.5 - m) * (24.5 - m) / v - 0.5 * Math.Log(2 * Math.PI * v), h.Bind(obs).LogDensity([]), 10);
    }

    [Fact]
    public void GridInterpolationMatchesExactDistances()
    {
        // 5000 objects > 96 nodes → interpolated ln D_A; compare with exact D_A per object (fixed cosmology path).
        var model = TestWorldModels.FlatLcdm.Create(new Dictionary<string, double>());
        var obs = MockCatalogue.Draw(model, 5000, new MockCatalogue.Truth(), seed: 3, zMin: 0.02, zMax: 6);
        var free = Hypothesis.Create(TestWorldModels.FlatLcdm, SizeOnly, new ParameterOverrides(Free: new HashSet<string> { "omega_m" })).Bind(obs);
        var fixedCosmo = Hypothesis.Create(TestWorldModels.FlatLcdm, SizeOnly).Bind(obs);
        double[] th = [0.3, 4.0, -1.0, 0.2];
        // Cubic interpolation error on 96 nodes in ln z: |ΔlnD_A| ≲ 1e-6 per object, so |Δ ln L| ≲ 5000 · 1e-6 · |r/σ²| ≪ 0.01.
        Assert.Equal(fixedCosmo.LogDensity(th[1..]), free.LogDensity(th), 2);
    }

    [Fact]
    public void SlicedPartialSumsEqualTheFullSum()
    {
        var model = TestWorldModels.Eds.Create(new Dictionary<string, double>());
        var obs = MockCatalogue.Draw(model, 1000, new MockCatalogue.Truth(), seed: 5);
        foreach (var kind in new[] { ObservableKind.Size, ObservableKind.SurfaceBrightness, ObservableKind.Joint })
        {
            var nm = new NuisanceModel(kind, kind == ObservableKind.Joint ? new SelectionLimits(SbLimit: 25, MinThetaArcsec: 0.1) : null, SizeSbRelation: kind == ObservableKind.Joint);
            var lik = Hypothesis.Create(TestWorldModels.Eds, nm).Bind(obs);
            var theta = lik.SuggestStart();
            var e = lik.Prepare(theta)!;
            double parts = lik.SumSlice(e, 0, 137) + lik.SumSlice(e, 137, 600) + lik.SumSlice(e, 600, 1000);
            // Same terms, different association: equal to rounding; checked to 1e-9 relative (common practice).
            double full = lik.LogDensity(theta);
            Assert.True(Math.Abs(parts - full) <= 1e-9 * Math.Abs(full), $"{kind}: slices {parts:R}, full {full:R}");
        }
    }

    [Fact]
    public void LikelihoodIsInvariantUnderRowOrder()
    {
        var model = TestWorldModels.Eds.Create(new Dictionary<string, double>());
        var obs = MockCatalogue.Draw(model, 300, new MockCatalogue.Truth(), seed: 11);
        var nm = new NuisanceModel(ObservableKind.Joint, SizeSbRelation: true);
        var h = Hypothesis.Create(TestWorldModels.Eds, nm);
        var lik = h.Bind(obs);
        var theta = lik.SuggestStart();
        double reference = lik.LogDensity(theta);
        Gen.Int.Array[300].Sample(keys =>
        {
            var perm = Enumerable.Range(0, 300).OrderBy(i => keys[i]).ThenBy(i => i).ToArray();
            var shuffled = ObservablesSubset.Take(obs, perm);
            double v = h.Bind(shuffled).LogDensity(theta);
            // A sum is order-independent up to rounding (relative 1e-12 of |ln L| ~ 1e3).
            return Math.Abs(v - reference) < 1e-8 * Math.Abs(reference);
        }, iter: 30, seed: "0N0XIzNsQ0O2");
    }

    [Fact]
    public void OutsideBoundsIsMinusInfinity()
    {
        var obs = new Observables([0.5], [Math.Log(2e-6)], [0.1]);
        var lik = Hypothesis.Create(TestWorldModels.Eds, SizeOnly).Bind(obs);
        Assert.True(double.IsNegativeInfinity(lik.LogDensity([5, 0, -1])));   // scatter_dex < 0
        Assert.True(double.IsFinite(lik.LogDensity([5, 0, 0.2])));
    }

    [Fact]
    public void FreeingAParameterThatDoesNotEnterIsRefused()
    {
        var ex = Assert.Throws<InputException>(() => Hypothesis.Create(TestWorldModels.FlatLcdm, new NuisanceModel(ObservableKind.SurfaceBrightness),
            new ParameterOverrides(Free: new HashSet<string> { "omega_m" })));
        Assert.Contains("omega_m", ex.Message);
    }
}

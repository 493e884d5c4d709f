using SizeTest.Cosmology;
using SizeTest.Distributed;
using SizeTest.Inference;
using SizeTest.Photometry;
using Xunit;

namespace SizeTest.Tests.Distributed;

/// <summary>
/// The grid kernel computes the same angular-size likelihood as the inference stage's
/// <see cref="HypothesisLikelihood"/> (which, with the cosmology fixed, uses the exact D_A of every object):
/// they differ only by the kernel's grid interpolation (≤ 1e-6 in ln θ, LogRedshiftGridTests).
/// </summary>
public sealed class KernelMatchesInferenceLikelihoodTests
{
    [Theory]
    [InlineData(5.0, -1.0, 0.2)]
    [InlineData(3.5, -0.3, 0.35)]
    public void SameLogLikelihoodAsHypothesisLikelihoodForFlatLcdm(double r0Kpc, double a, double sigmaLn)
    {
        const int n = 20_000;
        var z = new double[n]; var y = new double[n]; var e = new double[n];
        SyntheticKernelRows.Fill(23, 0, z, y, e); // SYNTHETIC
        var hyp = Hypothesis.Create(WorldModels.LambdaCdm, new NuisanceModel(ObservableKind.Size));
        var names = hyp.FreeParameters.Select(p => p.Name).ToArray();
        Assert.Equal(["r0_kpc", "size_evolution", "scatter_dex"], names);
        double inference = hyp.Bind(new Observables(z, y, e)).LogDensity([r0Kpc, a, sigmaLn / Math.Log(10)]); // scatter_dex = σ_ln / ln 10

        var model = WorldModels.LambdaCdm.Create(new Dictionary<string, double>()); // the same defaults (H0 = 70, Ωm = 0.3, flat)
        var grid = LogRedshiftGrid.Covering(z, 4096);
        var cols = KernelColumns.Build(z, y, e, grid);
        var g = new double[grid.Count];
        AngularSizeModelGrid.Fill(model, grid, Math.Log(r0Kpc), a, g);
        double kernel = GaussianGridKernel.LogLikelihoodParallel(cols, 0, n, g, sigmaLn);
        // Tolerance: per-object model error ≤ 1e-6 (interpolation) changes ln L by ≲ Σ|r_i|·1e-6/v_i ≈ n·1e-5 ≈ 0.2
        // in absolute terms here; |ln L| is ~4e3–2e4, so 1e-5 relative is a safe bound (closed-form estimate;
        // measured here: 2e-8 and 1.3e-7 relative).
        Assert.True(Math.Abs(kernel - inference) <= 1e-5 * Math.Abs(inference), $"kernel {kernel:R} vs inference {inference:R}");
    }
}

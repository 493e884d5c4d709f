using SizeTest.Inference;
using SizeTest.Photometry;
using Xunit;

namespace SizeTest.Tests.Inference;

/// <summary>
/// The quadratic-form (Gram) evaluation of the size likelihood for equal ln θ errors against the per-row sum: the
/// identity Σ r_i² = βᵀ G β (SizeSliceGram remarks; exact algebra) says both give the same ln L and gradient up to
/// rounding. The per-row path is forced by making one row's error differ by 10⁻⁹ relative (beyond the 10⁻¹² uniformity
/// tolerance), which itself moves ln L by only ~10⁻¹¹ (∂ℓ/∂v · Δv for one row).
/// </summary>
public sealed class SizeSliceGramTests
{
    private static readonly NuisanceModel SizeOnly = new(ObservableKind.Size);

    private static (Observables Uniform, Observables PerRow) Samples(int n)
    {
        var obs = MockCatalogue.Draw(TestWorldModels.FlatLcdm.Create(new Dictionary<string, double>()), n, new MockCatalogue.Truth(), seed: 11, zMin: 0.05, zMax: 4);
        var err = obs.LnThetaErr!.ToArray();
        err[n / 2] *= 1 + 1e-9;
        return (obs, new Observables(obs.Z, obs.LnTheta, err));
    }

    [Theory]
    [InlineData(0.3, 4.0, -1.0, 0.2)]   // near the truth
    [InlineData(0.9, 7.0, -0.2, 0.35)]  // far from it (large residuals)
    public void GramEqualsPerRowSumWithGridAndGradient(double om, double r0, double a, double scatter)
    {
        // 40 000 objects: two 32 768-row chunks in the backend, so slices of unequal length are covered.
        var (uniform, perRow) = Samples(40_000);
        var h = Hypothesis.Create(TestWorldModels.FlatLcdm, SizeOnly, new ParameterOverrides(Free: new HashSet<string> { "omega_m" }));
        double[] th = [om, r0, a, scatter];
        foreach (var bind in new Func<Observables, ILogDensityWithGradient>[] { o => h.Bind(o), o => SizeTest.Inference.Evaluation.EvaluationBackend.InProcess(o).Bind(h) })
        {
            var g1 = new double[4];
            var g2 = new double[4];
            double l1 = bind(uniform).LogDensityAndGradient(th, g1), l2 = bind(perRow).LogDensityAndGradient(th, g2);
            Assert.InRange(Math.Abs(l1 - l2), 0, 1e-7 + 1e-12 * Math.Abs(l2));
            Assert.InRange(Math.Abs(bind(uniform).LogDensity(th) - l2), 0, 1e-7 + 1e-12 * Math.Abs(l2));
            for (int j = 0; j < 4; j++) Assert.InRange(Math.Abs(g1[j] - g2[j]), 0, 1e-6 * (1 + Math.Abs(g2[j])));
        }
    }

    [Fact]
    public void GramEqualsPerRowSumWithFixedDistancesAndInProfileRefits()
    {
        var (uniform, perRow) = Samples(5000);
        // Fixed cosmology (exact per-object D_A) and a refit likelihood with Ωm held (grid values fixed, shared Gram).
        var fixedCosmo = Hypothesis.Create(TestWorldModels.FlatLcdm, SizeOnly);
        var free = Hypothesis.Create(TestWorldModels.FlatLcdm, SizeOnly, new ParameterOverrides(Free: new HashSet<string> { "omega_m" }));
        double[] th = [4.2, -0.8, 0.22];
        Assert.Equal(fixedCosmo.Bind(perRow).LogDensity(th), fixedCosmo.Bind(uniform).LogDensity(th), 1e-7);
        var b1 = SizeTest.Inference.Evaluation.EvaluationBackend.InProcess(uniform);
        var b2 = SizeTest.Inference.Evaluation.EvaluationBackend.InProcess(perRow);
        var p1 = b1.Bind(free).WithFixed("omega_m", 0.25);
        var p2 = b2.Bind(free).WithFixed("omega_m", 0.25);
        var g1 = new double[3];
        var g2 = new double[3];
        Assert.Equal(p2.LogDensityAndGradient(th, g2), p1.LogDensityAndGradient(th, g1), 1e-7);
        for (int j = 0; j < 3; j++) Assert.InRange(Math.Abs(g1[j] - g2[j]), 0, 1e-6 * (1 + Math.Abs(g2[j])));
        // The refit likelihood is the likelihood of the hypothesis with Ωm fixed bound afresh, up to the grid interpolation.
        Assert.Equal(b2.Bind(free.WithFixed("omega_m", 0.25)).LogDensity(th), p1.LogDensity(th), 1e-2);
    }
}

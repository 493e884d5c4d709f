using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Photometry;
using Xunit;

namespace SizeTest.Tests.Inference;

/// <summary>
/// The analytic gradient of ln L (and of ln posterior with priors) against central finite differences of ln L itself,
/// for every observable, every selection cut (single and pairs), free cosmology (Ωm, with and without h0; wCDM w0),
/// free dimming exponent and isophotal sizes. Reference: Richardson-extrapolated central differences
/// D = [4D(h/2) − D(h)]/3 with h = 10⁻³·max(|θ_j|, 0.05) (error O(h⁴), Press et al. 2007 §5.7), evaluated at a point
/// away from the maximum so gradient components are large.
/// Tolerance: |analytic − FD| ≤ 10⁻⁶ (|FD| + 1): relative 10⁻⁶, with an absolute floor of 10⁻⁶ in ln L units for
/// components near zero (the FD reference itself has rounding error ~10⁻¹⁶|ln L|/h ≈ 10⁻⁹ here).
/// </summary>
public sealed class GradientTests
{
    internal static double[] FiniteDifference(ILogDensity f, double[] theta)
    {
        var g = new double[theta.Length];
        for (int j = 0; j < theta.Length; j++)
        {
            double h = 1e-3 * Math.Max(Math.Abs(theta[j]), 0.05);
            double D(double step)
            {
                var p = (double[])theta.Clone(); p[j] += step;
                var m = (double[])theta.Clone(); m[j] -= step;
                return (f.LogDensity(p) - f.LogDensity(m)) / (2 * step);
            }
            g[j] = (4 * D(h / 2) - D(h)) / 3;
        }
        return g;
    }

    private static void AssertGradient(ILogDensityWithGradient f, double[] theta, string label)
    {
        var analytic = new double[theta.Length];
        double v = f.LogDensityAndGradient(theta, analytic);
        Assert.True(double.IsFinite(v), $"{label}: ln L not finite at the test point");
        Assert.Equal(f.LogDensity(theta), v, 9); // the same value from both paths (rounding only)
        var fd = FiniteDifference(f, theta);
        for (int j = 0; j < theta.Length; j++)
            Assert.True(Math.Abs(analytic[j] - fd[j]) <= 1e-6 * (Math.Abs(fd[j]) + 1),
                $"{label}: parameter {j}: analytic {analytic[j]:R}, finite difference {fd[j]:R}");
    }

    // A point off the maximum: each free parameter moved by +3% of itself (or +0.02 when near 0).
    internal static double[] OffMaximum(HypothesisLikelihood lik)
    {
        var t = lik.SuggestStart();
        var free = lik.Hypothesis.FreeParameters;
        for (int j = 0; j < t.Length; j++)
            t[j] = Math.Clamp(t[j] + Math.Max(0.03 * Math.Abs(t[j]), 0.02), free[j].Min, free[j].Max - 1e-6);
        return t;
    }

    private static Observables Sample(int n = 400, int seed = 7)
    {
        var model = WorldModels.LambdaCdm.Create(new Dictionary<string, double>());
        return MockCatalogue.Draw(model, n, new MockCatalogue.Truth(Kormendy: 2.0), seed, zMin: 0.05, zMax: 2.5);
    }

    public static TheoryData<string, string, double?, double?, double?, bool> Cases() => new()
    {
        // observable, free cosmology, SB limit, mag limit, min size (arcsec), size–SB relation
        { "size", "", null, null, null, false },
        { "size", "", null, null, 0.3, false },
        { "size", "omega_m", null, null, null, false },
        { "size", "omega_m", null, null, 0.3, false },
        { "size", "omega_m,h0", null, null, 0.3, false },
        { "sb", "", null, null, null, false },
        { "sb", "", 24.0, null, null, false },
        { "joint", "", null, null, null, false },
        { "joint", "", null, null, null, true },
        { "joint", "omega_m", 24.0, null, null, true },
        { "joint", "omega_m", null, 22.5, null, true },
        { "joint", "omega_m", null, null, 0.3, true },
        { "joint", "omega_m", 24.0, 22.5, null, true },
        { "joint", "omega_m", 24.0, null, 0.3, true },
        { "joint", "omega_m,h0", null, 22.5, 0.3, true },
        { "joint", "omega_m", 24.0, null, 0.3, false },
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void AnalyticGradientEqualsFiniteDifferences(string observable, string freeCosmology, double? sbLimit, double? magLimit, double? minSize, bool relation)
    {
        var kind = observable switch { "size" => ObservableKind.Size, "sb" => ObservableKind.SurfaceBrightness, _ => ObservableKind.Joint };
        var nm = new NuisanceModel(kind, new SelectionLimits(sbLimit, magLimit, minSize), SizeSbRelation: relation);
        var free = freeCosmology.Split(',', StringSplitOptions.RemoveEmptyEntries).ToHashSet();
        var lik = Hypothesis.Create(WorldModels.LambdaCdm, nm, new ParameterOverrides(Free: free)).Bind(Sample());
        var theta = OffMaximum(lik);
        string label = $"{observable} free=[{freeCosmology}] sb={sbLimit} mag={magLimit} min={minSize} relation={relation}";
        AssertGradient(lik, theta, label);
        AssertGradient(lik.Posterior, theta, label + " (posterior)");
    }

    [Fact]
    public void GradientWithOtherWorldModelParametersAndPriors()
    {
        // wCDM with Ωm and w0 free (sizes with a minimum size), and a Gaussian prior on the size evolution.
        var obs = Sample(300, 11);
        var lik = Hypothesis.Create(WorldModels.WCdm, new NuisanceModel(ObservableKind.Size, new SelectionLimits(MinThetaArcsec: 0.3)),
            new ParameterOverrides(Free: new HashSet<string> { "omega_m", "w0" }, Priors: new Dictionary<string, (double Mean, double Sd)> { ["size_evolution"] = (-0.5, 0.3) })).Bind(obs);
        var theta = OffMaximum(lik);
        AssertGradient(lik, theta, "wcdm");
        AssertGradient(lik.Posterior, theta, "wcdm posterior with a Gaussian prior");
        // Static model with the dimming exponent free (SB with an SB limit): the gradient through n.
        var sb = Hypothesis.Create(WorldModels.TiredLight, new NuisanceModel(ObservableKind.SurfaceBrightness, new SelectionLimits(SbLimit: 24.0)),
            new ParameterOverrides(Free: new HashSet<string> { "dimming_exponent" })).Bind(obs);
        AssertGradient(sb, OffMaximum(sb), "tired light, dimming exponent free");
    }

    [Fact]
    public void IsophotalJointGradientEqualsFiniteDifferences()
    {
        var mock = IsophotalLikelihoodTests.Draw(300, 5);
        foreach (var cuts in new[] { SelectionLimits.None, new SelectionLimits(SbLimit: 24.5), new SelectionLimits(SbLimit: 24.5, MinThetaArcsec: 0.2) })
        {
            var lik = Hypothesis.Create(TestWorldModels.Eds, new NuisanceModel(ObservableKind.Joint, cuts, SizeSbRelation: true)).Bind(mock.Isophotal);
            var theta = lik.SuggestStart();
            // Small moves only: far from the data the model's isophote is not reached (ln L = −∞).
            for (int j = 0; j < theta.Length; j++) theta[j] += 0.01 * Math.Max(Math.Abs(theta[j]), 1);
            AssertGradient(lik, theta, $"isophotal {cuts}");
        }
    }

    [Fact]
    public void SliceGradientsAddUpToTheWholeGradient()
    {
        var lik = Hypothesis.Create(WorldModels.LambdaCdm, new NuisanceModel(ObservableKind.Joint, new SelectionLimits(SbLimit: 24.0, MinThetaArcsec: 0.3), SizeSbRelation: true),
            new ParameterOverrides(Free: new HashSet<string> { "omega_m" })).Bind(Sample());
        var theta = OffMaximum(lik);
        var whole = new double[theta.Length];
        double v = lik.LogDensityAndGradient(theta, whole);
        var e = lik.Prepare(theta, withGradient: true)!;
        var sum = new double[theta.Length];
        var part = new double[theta.Length];
        double total = 0;
        foreach (var (a, b) in new[] { (0, 57), (57, 250), (250, lik.Count) })
        {
            total += lik.SumSliceWithGradient(e, a, b, part);
            for (int j = 0; j < sum.Length; j++) sum[j] += part[j];
        }
        // Same terms, different association: equal to rounding (common practice: 1e-9 relative).
        Assert.Equal(v, total, 8);
        for (int j = 0; j < sum.Length; j++) Assert.Equal(whole[j], sum[j], 6);
    }

    [Fact]
    public void LogPhiAndBivariateDerivativesMatchDifferences()
    {
        // d lnΦ/dx and the Φ₂ closed forms against central differences of NormalMath itself (h = 1e-5; error ~h² ≈ 1e-10).
        foreach (double x in new[] { -35.0, -8.0, -1.3, 0.0, 2.1, 7.0 })
            Assert.Equal((NormalMath.LogPhi(x + 1e-5) - NormalMath.LogPhi(x - 1e-5)) / 2e-5, NormalMath.LogPhiDerivative(x), 6);
        foreach (var (h, k, r) in new[] { (0.3, -0.4, 0.5), (-1.2, 0.8, -0.7), (2.0, 1.5, 0.95), (-2.5, -2.0, 0.2) })
        {
            NormalMath.LogBivariatePhi(h, k, r, out double dh, out double dk, out double dr);
            const double e = 1e-5;
            Assert.Equal((NormalMath.LogBivariatePhi(h + e, k, r) - NormalMath.LogBivariatePhi(h - e, k, r)) / (2 * e), dh, 6);
            Assert.Equal((NormalMath.LogBivariatePhi(h, k + e, r) - NormalMath.LogBivariatePhi(h, k - e, r)) / (2 * e), dk, 6);
            Assert.Equal((NormalMath.LogBivariatePhi(h, k, r + e) - NormalMath.LogBivariatePhi(h, k, r - e)) / (2 * e), dr, 6);
        }
    }
}

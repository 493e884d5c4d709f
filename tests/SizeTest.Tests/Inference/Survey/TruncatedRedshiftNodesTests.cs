using Xunit;
using static SizeTest.Tests.Inference.Survey.SurveyFitting;
using Lcdm = SizeTest.Cosmology.LambdaCdmModel;
using SizeTest.Inference;
using SizeTest.Inference.Survey;
using SizeTest.Simulation;
using SizeTest.Cosmology;

namespace SizeTest.Tests.Inference.Survey;

/// <summary>
/// Photometric-redshift objects none of whose Gauss–Hermite nodes lies inside the redshift prior (before: every node dropped,
/// ln L = NaN and the fit failed with "not finite anywhere"): Gauss–Legendre on the prior under the truncated normal.
/// </summary>
public sealed class TruncatedRedshiftNodesTests(Xunit.Abstractions.ITestOutputHelper output)
{
    [Fact]
    public void GaussLegendreHasTheTabulatedThreePointRuleAndIsExactToDegreeTwoMMinusOne()
    {
        // Abramowitz & Stegun 1964, 25.4.29 / Table 25.4: m = 3, x = 0, ±√(3/5), w = 8/9, 5/9.
        var r = new GaussLegendre(3);
        Assert.Equal(-Math.Sqrt(0.6), r.Nodes[0], 1e-14); // absolute 1e-14 here and below
        Assert.Equal(0, r.Nodes[1], 1e-14);
        Assert.Equal(Math.Sqrt(0.6), r.Nodes[2], 1e-14);
        Assert.Equal(5.0 / 9, r.Weights[0], 1e-14);
        Assert.Equal(8.0 / 9, r.Weights[1], 1e-14);
        // Closed form ∫_{−1}^{1} x^12 dx = 2/13: exact for the 7-point rule (degree 12 ≤ 2·7 − 1), absolute 1e-14.
        var r7 = new GaussLegendre(7);
        Assert.Equal(2.0 / 13, r7.Nodes.Select((x, k) => r7.Weights[k] * Math.Pow(x, 12)).Sum(), 1e-14);
    }

    [Theory]
    [InlineData(0.10, 0.09, 7)] // below the prior by 2.2σ (the cost harness's case: σ_z = 0.08(1+z))
    [InlineData(2.40, 0.27, 5)] // above it by 1.5σ
    [InlineData(0.35, 0.60, 3)] // inside, σ wider than the range
    public void NodesReproduceTheTruncatedNormalsMassAndMean(double zObs, double sigma, int m)
    {
        const double lo = 0.3, hi = 2.0;
        var z = new double[m];
        var lw = new double[m];
        TruncatedRedshiftNodes.Fill(zObs, sigma, lo, hi, new GaussLegendre(m), z, lw);
        Assert.All(z, x => Assert.InRange(x, lo, hi));
        Assert.Equal(1, lw.Sum(Math.Exp), 1e-12); // normalised, absolute 1e-12
        // Closed form (truncated normal on [lo, hi], α = (lo − z_obs)/σ, β = (hi − z_obs)/σ):
        // E[z] = z_obs + σ (φ(α) − φ(β)) / (Φ(β) − Φ(α)).
        double a = (lo - zObs) / sigma, b = (hi - zObs) / sigma;
        double phiA = Math.Exp(-0.5 * a * a) / Math.Sqrt(2 * Math.PI), phiB = Math.Exp(-0.5 * b * b) / Math.Sqrt(2 * Math.PI);
        double mean = zObs + sigma * (phiA - phiB) / (NormalMath.Phi(b) - NormalMath.Phi(a));
        double quad = z.Select((x, k) => Math.Exp(lw[k]) * x).Sum();
        output.WriteLine($"z_obs {zObs}, σ {sigma}, m {m}: E[z] closed form {mean:F6}, nodes {quad:F6}");
        // The m-point rule on the window is not exact for the Gaussian (measured: 3·10⁻⁴ relative at m = 3 and 5, 10⁻⁵ at 7):
        // relative 10⁻³.
        Assert.Equal(mean, quad, mean * 1e-3);
    }

    [Theory]
    [InlineData(3)]
    [InlineData(5)]
    public void FewNodesNoLongerFailAndAgreeWithSevenNodes(int nodes)
    {
        // The cost harness's design: flat ΛCDM, z_true uniform on [0.3, 2], σ_z = 0.08 (1+z), prior [0.3, 2] (so objects with
        // z_obs well outside the prior exist), R = 5 kpc (1+z)^−1 with 0.2 dex scatter, 5% log-normal errors.
        var obs = Draw(new Lcdm(70, 0.3), 2000, 31, "uniform:0.3:2", errors: new MeasurementErrors(0.05, MuErrorMag: 0, PhotoZError: 0.08)).ToObservables();
        var sv = new SurveyModel(MarginaliseRedshift: true, RedshiftPriorMin: 0.3, RedshiftPriorMax: 2);
        var (few, lik) = Fit(WorldModels.LambdaCdm, obs, sv with { RedshiftNodes = nodes });
        var (seven, _) = Fit(WorldModels.LambdaCdm, obs, sv);
        Assert.True(double.IsFinite(few.LogLikelihood));
        output.WriteLine(string.Join(" | ", lik.SurveyNotes));
        int outside = Enumerable.Range(0, obs.Count).Count(i => obs.Z[i] < 0.3 || obs.Z[i] > 2);
        output.WriteLine($"{outside} objects with z_obs outside the prior; min z_obs {obs.Z.Min():F3}");
        Assert.Contains(lik.SurveyNotes, n => n.Contains("Gauss–Legendre", StringComparison.Ordinal));
        var a = Est(few, "size_evolution");
        var a7 = Est(seven, "size_evolution");
        output.WriteLine($"{nodes} nodes: a = {a.Value:F4} [{a.Lo:F4}, {a.Hi:F4}]; 7 nodes: a = {a7.Value:F4}");
        // The quadrature converges: the few-node a lies within one half-width of the 7-node 68% interval (common practice).
        Assert.InRange(a.Value, a7.Value - (a7.Value - a7.Lo), a7.Value + (a7.Hi - a7.Value));
    }
}

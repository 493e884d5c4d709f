using MathNet.Numerics.Distributions;
using SizeTest.Inference.Sampling;
using Xunit;

namespace SizeTest.Tests.Inference.Sampling;

/// <summary>The kernel-density and mixture moves and the Laplace start, on posteriors with closed-form moments.</summary>
public sealed class EnsembleMoveTests
{
    // Mean and covariance of the flat draws after the burn-in.
    private static (double[] Mean, double[,] Cov) Moments(EnsembleRun run)
    {
        var s = run.Samples;
        int d = s[0].Length;
        var mean = new double[d];
        foreach (var x in s) for (int i = 0; i < d; i++) mean[i] += x[i] / s.Length;
        var cov = new double[d, d];
        foreach (var x in s)
            for (int i = 0; i < d; i++)
                for (int j = 0; j < d; j++) cov[i, j] += (x[i] - mean[i]) * (x[j] - mean[j]) / (s.Length - 1);
        return (mean, cov);
    }

    // Means within 5 σ/√ESS and covariances within 5 √((σ_ii σ_jj + σ_ij²)/ESS) (Gaussian sampling theory, Anderson 2003
    // §3.3; ESS from the run's diagnostics for correlated draws, common practice). For the non-Gaussian target the
    // fourth-moment formula is an approximation, so 5 standard errors keep a wide margin.
    private static void AssertMoments(EnsembleRun run, double[] mean, double[,] cov)
    {
        var (m, c) = Moments(run);
        int d = mean.Length;
        for (int i = 0; i < d; i++)
        {
            double ess = run.Diagnostics.Parameters[i].MinEss;
            Assert.True(ess > 300, $"ESS {ess} too small for a meaningful test");
            double sd = Math.Sqrt(cov[i, i]);
            Assert.InRange(m[i] - mean[i], -5 * sd / Math.Sqrt(ess), 5 * sd / Math.Sqrt(ess));
            for (int j = 0; j < d; j++)
            {
                double se = Math.Sqrt((cov[i, i] * cov[j, j] + cov[i, j] * cov[i, j]) / Math.Min(ess, run.Diagnostics.Parameters[j].MinEss));
                Assert.InRange(c[i, j] - cov[i, j], -5 * se, 5 * se);
            }
        }
    }

    private static readonly double[,] Degenerate = { { 1.0, 0.99 * 0.1 }, { 0.99 * 0.1, 0.01 } }; // σ = 1, 0.1, ρ = 0.99

    [Fact]
    public void KernelDensityMoveSamplesADegenerateGaussianWithShortAutocorrelation()
    {
        // Correlation 0.99, the R0–a–Ωm degeneracy of the size fit in miniature. Stretch move on a 2-D Gaussian: τ of
        // order 20–40 steps whatever the correlation (affine invariance; Goodman & Weare 2010 §5); a kernel-density
        // proposal built from a spread ensemble matches the target and accepts most jumps, so τ is a few steps.
        var target = new GaussianDensity([1.0, -2.0], Degenerate);
        var start = EnsembleSampler.GaussianStart(target, [1.0, -2.0], Degenerate, 32, 3);
        var run = new EnsembleSampler(target, new EnsembleSamplerOptions { Walkers = 32, Steps = 800, Seed = 11, Move = new KernelDensityMove(), MaxDegreeOfParallelism = 1 })
            .Run(start);
        AssertMoments(run, target.Mean, Degenerate);
        Assert.True(run.Converged, run.Diagnostics.Verdict.Summary);
        Assert.True(run.Diagnostics.MaxTau < 8, $"τ = {run.Diagnostics.MaxTau}");
        Assert.Equal("kde", run.MoveName);
    }

    /// <summary>
    /// x ~ N(μ = 0.2, σ = 1) truncated to x ≥ 0 and y | x ~ N(x, 0.1²): bounded, skewed and correlated. Closed form
    /// (Johnson, Kotz &amp; Balakrishnan 1994, Continuous Univariate Distributions vol. 1, §10.1): with α = −μ/σ,
    /// λ = φ(α)/(1 − Φ(α)), E x = μ + σλ, Var x = σ²(1 + αλ − λ²); E y = E x, Var y = Var x + 0.01, Cov(x, y) = Var x.
    /// </summary>
    private sealed class BoundedSkewed : SizeTest.Inference.ILogDensity
    {
        public int Dimension => 2;
        public double LogDensity(ReadOnlySpan<double> t) =>
            t[0] < 0 ? double.NegativeInfinity : -0.5 * (t[0] - 0.2) * (t[0] - 0.2) - 0.5 * (t[1] - t[0]) * (t[1] - t[0]) / 0.01;

        public static (double[] Mean, double[,] Cov) Exact()
        {
            double alpha = -0.2, lambda = Normal.PDF(0, 1, alpha) / (1 - Normal.CDF(0, 1, alpha));
            double mx = 0.2 + lambda, vx = 1 + alpha * lambda - lambda * lambda;
            return ([mx, mx], new[,] { { vx, vx }, { vx, vx + 0.01 } });
        }
    }

    [Fact]
    public void DefaultMixtureSamplesABoundedSkewedPosteriorToConvergence()
    {
        var target = new BoundedSkewed();
        var (mean, cov) = BoundedSkewed.Exact();
        // Laplace-like start at the constrained mode (0, 0) with a guessed covariance, as the fitter does.
        var start = EnsembleSampler.GaussianStart(target, [0.05, 0.05], new[,] { { 0.5, 0.5 }, { 0.5, 0.51 } }, 32, 5);
        var run = new EnsembleSampler(target, new EnsembleSamplerOptions
        {
            Walkers = 32, Steps = 1000, MaxSteps = 20000, Seed = 21, Move = MixtureMove.Default(), MaxDegreeOfParallelism = 1,
        }).Run(start);
        Assert.True(run.Converged, run.Diagnostics.Verdict.Summary);
        AssertMoments(run, mean, cov);
        Assert.All(run.Samples, s => Assert.True(s[0] >= 0));
        Assert.Equal("0.5 kde + 0.25 differential-evolution + 0.25 stretch", run.MoveName);
    }

    [Fact]
    public void MixtureChainIsIdenticalForAnyThreadCountAndDependsOnTheSeed()
    {
        var target = new GaussianDensity([0.0, 1.0, 2.0], new[,] { { 1.0, 0.3, 0 }, { 0.3, 1.0, 0 }, { 0, 0, 2.0 } });
        var start = EnsembleSampler.GaussianBall([0.0, 1.0, 2.0], [0.1, 0.1, 0.1], 12, 1);
        EnsembleRun RunWith(int threads, int seed) => new EnsembleSampler(target, new EnsembleSamplerOptions
        { Walkers = 12, Steps = 150, Seed = seed, Move = MixtureMove.Default(), MaxDegreeOfParallelism = threads }).Run(start);
        var serial = RunWith(1, 77);
        var parallel = RunWith(4, 77);
        Assert.Equal(serial.Chain.GetFlatChain().SelectMany(x => x), parallel.Chain.GetFlatChain().SelectMany(x => x));
        Assert.NotEqual(serial.FinalPositions[0][0], RunWith(1, 78).FinalPositions[0][0]);
    }

    [Fact]
    public void KernelDensityFactorIsTheRatioOfKernelSums()
    {
        // One complement walker: q(y) = N(y; X_c, h²Σ) with Σ the (1-walker-undefined) covariance; use two complement
        // walkers at ±1 in 1-D: Σ = 2 (n − 1 = 1), h = 1 → q(y) ∝ e^{−(y−1)²/4} + e^{−(y+1)²/4}. Closed form of the log
        // factor ln q(x) − ln q(y) for x = 0.
        double[] positions = [0.0, -1.0, 1.0];
        var proposals = new double[1];
        var factors = new double[1];
        new KernelDensityMove(bandwidth: 1.0).Propose(positions, 1, [0], [1, 2], new Random(4), proposals, factors);
        double y = proposals[0];
        static double LogQ(double v) => Math.Log(Math.Exp(-(v - 1) * (v - 1) / 4) + Math.Exp(-(v + 1) * (v + 1) / 4));
        Assert.Equal(LogQ(0) - LogQ(y), factors[0], 12);
    }

    [Fact]
    public void GaussianStartDrawsTheCovarianceInsideTheSupport()
    {
        // 4000 draws of N(0, Σ) truncated to x ≥ −0.5 (Σ = the degenerate matrix above): every point inside; the y
        // spread matches Σ within 5 standard errors of a variance of the untruncated part (the truncation removes
        // Φ(−0.5) = 31% of x, so only the sign of the effect is robust: x mean moves up).
        var density = new DelegateDensity(2, t => t[0] < -0.5 ? double.NegativeInfinity : 0.0);
        var start = EnsembleSampler.GaussianStart(density, [0.0, 0.0], Degenerate, 4000, 9);
        Assert.All(start, s => Assert.True(s[0] >= -0.5));
        double mx = start.Average(s => s[0]);
        // Mean of N(0,1) truncated at −0.5: λ = φ(0.5)/Φ(0.5) = 0.5092 (closed form as above).
        Assert.InRange(mx, 0.5092 - 5 * 0.8 / Math.Sqrt(4000), 0.5092 + 5 * 0.8 / Math.Sqrt(4000));
        double corr = Correlation(start);
        Assert.InRange(corr, 0.98, 0.995);
        Assert.Throws<ArgumentException>(() => EnsembleSampler.GaussianStart(density, [0.0, 0.0], new[,] { { 1.0, 2.0 }, { 2.0, 1.0 } }, 4, 1));
    }

    private static double Correlation(double[][] s)
    {
        double mx = s.Average(v => v[0]), my = s.Average(v => v[1]);
        double sxy = s.Sum(v => (v[0] - mx) * (v[1] - my)), sxx = s.Sum(v => (v[0] - mx) * (v[0] - mx)), syy = s.Sum(v => (v[1] - my) * (v[1] - my));
        return sxy / Math.Sqrt(sxx * syy);
    }
}

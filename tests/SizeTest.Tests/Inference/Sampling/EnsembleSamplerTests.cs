using SizeTest.Foundation.Errors;
using SizeTest.Inference.Sampling;
using Xunit;

namespace SizeTest.Tests.Inference.Sampling;

public sealed class EnsembleSamplerTests
{
    private static double[][] Ball(double[] centre, double scale, int walkers, int seed) =>
        EnsembleSampler.GaussianBall(centre, centre.Select(_ => scale).ToArray(), walkers, seed);

    /// <summary>
    /// Checks sample means and covariances against the target Gaussian. The standard error of
    /// a mean is σ/√ESS and of a variance σ²√(2/ESS) (Gaussian sampling theory; ESS from the
    /// run's own diagnostics replaces n for correlated draws, common practice). Bounds at 5
    /// standard errors: a false failure has probability ~6e-7 per assertion, and the test is seeded.
    /// </summary>
    private static void AssertMatchesGaussian(EnsembleRun run, GaussianDensity target)
    {
        int d = target.Dimension;
        var samples = run.Samples;
        var mean = new double[d];
        foreach (var s in samples) for (int i = 0; i < d; i++) mean[i] += s[i] / samples.Length;
        var cov = new double[d, d];
        foreach (var s in samples)
            for (int i = 0; i < d; i++)
                for (int j = 0; j < d; j++)
                    cov[i, j] += (s[i] - mean[i]) * (s[j] - mean[j]) / (samples.Length - 1);
        for (int i = 0; i < d; i++)
        {
            double ess = run.Diagnostics.Parameters[i].MinEss;
            Assert.True(ess > 200, $"ESS {ess} too small for a meaningful test");
            double sigma = Math.Sqrt(target.Covariance[i, i]);
            Assert.InRange(mean[i] - target.Mean[i], -5 * sigma / Math.Sqrt(ess), 5 * sigma / Math.Sqrt(ess));
            for (int j = 0; j < d; j++)
            {
                double essIj = Math.Min(ess, run.Diagnostics.Parameters[j].MinEss);
                // SE of a sample covariance: √((σ_ii σ_jj + σ_ij²)/n) (Gaussian fourth moments, Anderson 2003 §3.3).
                double se = Math.Sqrt((target.Covariance[i, i] * target.Covariance[j, j] + target.Covariance[i, j] * target.Covariance[i, j]) / essIj);
                Assert.InRange(cov[i, j] - target.Covariance[i, j], -5 * se, 5 * se);
            }
        }
    }

    [Fact]
    [Trait("Category", "Slow")]
    public void SamplesCorrelatedTwoDimensionalGaussian()
    {
        var target = new GaussianDensity([1.0, -2.0], new[,] { { 1.0, 0.9 * 1.0 * 2.0 }, { 0.9 * 1.0 * 2.0, 4.0 } });
        var options = new EnsembleSamplerOptions { Walkers = 32, Steps = 3000, Seed = 42, MaxDegreeOfParallelism = 1 };
        var run = new EnsembleSampler(target, options).Run(Ball([1.0, -2.0], 0.1, 32, 7));
        AssertMatchesGaussian(run, target);
        // Stretch move on a 2-D Gaussian: acceptance typically 0.5–0.8 (Goodman & Weare 2010 §5; from memory).
        Assert.InRange(run.AcceptanceFraction, 0.4, 0.9);
        Assert.True(run.Converged, run.Diagnostics.Verdict.Summary);
    }

    [Fact]
    [Trait("Category", "Slow")]
    public void SamplesFiveDimensionalGaussian()
    {
        int d = 5;
        var cov = new double[d, d];
        var mean = new double[d];
        var rng = new Random(3);
        // Covariance σ_i σ_j ρ^|i−j| with ρ = 0.5 and σ_i from 0.5 to 2.5 (positive definite: AR(1) correlation matrix).
        for (int i = 0; i < d; i++)
        {
            mean[i] = rng.NextDouble() * 10 - 5;
            for (int j = 0; j < d; j++)
                cov[i, j] = (0.5 + 0.5 * i) * (0.5 + 0.5 * j) * Math.Pow(0.5, Math.Abs(i - j));
        }
        var target = new GaussianDensity(mean, cov);
        var options = new EnsembleSamplerOptions { Walkers = 40, Steps = 4000, Seed = 5, MaxDegreeOfParallelism = 1 };
        var run = new EnsembleSampler(target, options).Run(Ball(mean, 0.05, 40, 11));
        AssertMatchesGaussian(run, target);
        // Stretch move acceptance falls with dimension; ~0.3–0.5 in 5-D (Goodman & Weare 2010 §5; from memory).
        Assert.InRange(run.AcceptanceFraction, 0.2, 0.7);
        Assert.True(run.Converged, run.Diagnostics.Verdict.Summary);
    }

    [Fact]
    public void DifferentialEvolutionMoveSamplesGaussian()
    {
        var target = new GaussianDensity([0.0, 0.0], new[,] { { 1.0, 0.5 }, { 0.5, 1.0 } });
        var options = new EnsembleSamplerOptions { Walkers = 24, Steps = 2000, Seed = 9, Move = new DifferentialEvolutionMove(), MaxDegreeOfParallelism = 1 };
        var run = new EnsembleSampler(target, options).Run(Ball([0.0, 0.0], 0.1, 24, 2));
        AssertMatchesGaussian(run, target);
        Assert.Equal("differential-evolution", run.MoveName);
    }

    [Fact]
    public void ChainIsIdenticalForAnyThreadCount()
    {
        var target = new GaussianDensity([0.0, 1.0, 2.0], new[,] { { 1.0, 0.3, 0 }, { 0.3, 1.0, 0 }, { 0, 0, 2.0 } });
        var start = Ball([0.0, 1.0, 2.0], 0.1, 12, 1);
        EnsembleRun RunWith(int threads) =>
            new EnsembleSampler(target, new EnsembleSamplerOptions { Walkers = 12, Steps = 200, Seed = 77, MaxDegreeOfParallelism = threads }).Run(start);
        var serial = RunWith(1);
        var parallel = RunWith(4);
        Assert.Equal(serial.Chain.GetFlatChain().SelectMany(x => x), parallel.Chain.GetFlatChain().SelectMany(x => x));
        Assert.Equal(serial.AcceptanceFraction, parallel.AcceptanceFraction);
        var otherSeed = new EnsembleSampler(target, new EnsembleSamplerOptions { Walkers = 12, Steps = 200, Seed = 78 }).Run(start);
        Assert.NotEqual(serial.FinalPositions[0][0], otherSeed.FinalPositions[0][0]);
    }

    [Fact]
    public void ShortRunIsNotReportedAsConverged()
    {
        var target = new GaussianDensity([0, 0, 0, 0, 0], Diagonal(5, 1.0));
        var run = new EnsembleSampler(target, new EnsembleSamplerOptions { Walkers = 10, Steps = 60, Seed = 1, BurnIn = 10 })
            .Run(Ball([5, 5, 5, 5, 5], 0.01, 10, 3));
        Assert.False(run.Converged);
        Assert.NotEmpty(run.Diagnostics.Verdict.Reasons);
        Assert.StartsWith("not converged: ", run.Diagnostics.Verdict.Summary);
        Assert.Contains(run.Diagnostics.Verdict.Checks, c => !c.Passed && c.Name is "length_in_tau" or "tau_window" or "ess");
    }

    [Fact]
    public void ExtendsARunUntilItConverges()
    {
        // 4-D Gaussian, 16 walkers: τ is several tens of steps, so 400 steps (300 after burn-in) is far below
        // 50 τ; with MaxSteps the run must keep going until the verdict passes, and stay deterministic.
        var target = new GaussianDensity([0, 0, 0, 0], Diagonal(4, 1.0));
        var options = new EnsembleSamplerOptions { Walkers = 16, Steps = 400, MaxSteps = 40000, Seed = 4, MaxDegreeOfParallelism = 1 };
        var start = Ball([0, 0, 0, 0], 0.1, 16, 5);
        var run = new EnsembleSampler(target, options).Run(start);
        Assert.True(run.Converged, run.Diagnostics.Verdict.Summary);
        Assert.True(run.Chain.Steps > 400);
        Assert.Equal(run.Chain.Steps / 4, run.BurnIn);
        Assert.True(run.Chain.Steps - run.BurnIn >= 50 * run.Diagnostics.MaxTau);
        var again = new EnsembleSampler(target, options).Run(start);
        Assert.Equal(run.Chain.Steps, again.Chain.Steps);
        Assert.Equal(run.FinalPositions[3][2], again.FinalPositions[3][2]);
        var plain = new EnsembleSampler(target, options with { MaxSteps = null }).Run(start);
        Assert.Equal(400, plain.Chain.Steps);
        Assert.False(plain.Converged);
        Assert.Throws<ArgumentException>(() => new EnsembleSampler(target, options with { MaxSteps = 100 }));
    }

    [Fact]
    public void RefusesTooFewWalkers()
    {
        var target = new GaussianDensity([0, 0, 0], Diagonal(3, 1.0));
        var ex = Assert.Throws<ArgumentException>(() => new EnsembleSampler(target, new EnsembleSamplerOptions { Walkers = 5 }));
        Assert.Contains("at least 2 × 3 = 6 walkers", ex.Message);
    }

    [Fact]
    public void RefusesNaNStartingLogDensity()
    {
        var density = new DelegateDensity(2, x => x[0] > 0.5 ? double.NaN : -0.5 * (x[0] * x[0] + x[1] * x[1]));
        var start = Ball([0, 0], 0.1, 8, 1);
        start[3] = [0.6, 0.0];
        var ex = Assert.Throws<ArgumentException>(() =>
            new EnsembleSampler(density, new EnsembleSamplerOptions { Walkers = 8, Steps = 10 }).Run(start));
        Assert.Contains("starting walker 3 is NaN", ex.Message);
    }

    [Fact]
    public void RefusesStartOutsideSupport()
    {
        var density = new DelegateDensity(2, x => x[0] < 0 ? double.NegativeInfinity : 0.0);
        var start = Ball([1, 0], 0.1, 8, 1);
        start[0] = [-1.0, 0.0];
        var ex = Assert.Throws<ArgumentException>(() =>
            new EnsembleSampler(density, new EnsembleSamplerOptions { Walkers = 8, Steps = 10 }).Run(start));
        Assert.Contains("outside the support", ex.Message);
    }

    [Fact]
    public void RefusesDegenerateEnsembles()
    {
        var target = new GaussianDensity([0, 0], Diagonal(2, 1.0));
        var sampler = new EnsembleSampler(target, new EnsembleSamplerOptions { Walkers = 8, Steps = 10 });
        // All walkers at one point.
        var same = Enumerable.Range(0, 8).Select(_ => new[] { 0.1, 0.2 }).ToArray();
        Assert.Contains("do not spread", Assert.Throws<ArgumentException>(() => sampler.Run(same)).Message);
        // Walkers on a line y = 2x: spread in each coordinate, but linearly dependent.
        var line = Enumerable.Range(0, 8).Select(i => new[] { 0.01 * i, 0.02 * i }).ToArray();
        Assert.Contains("linearly dependent", Assert.Throws<ArgumentException>(() => sampler.Run(line)).Message);
        // Wrong number of walkers.
        Assert.Throws<ArgumentException>(() => sampler.Run(Ball([0, 0], 0.1, 6, 1)));
    }

    [Fact]
    public void NaNDuringRunRaisesAnalysisException()
    {
        var density = new DelegateDensity(1, x => x[0] > 3 ? double.NaN : -0.5 * x[0] * x[0]);
        var sampler = new EnsembleSampler(density, new EnsembleSamplerOptions { Walkers = 8, Steps = 5000, Seed = 2 });
        Assert.Throws<AnalysisException>(() => sampler.Run(Ball([0], 0.5, 8, 4)));
    }

    [Fact]
    public void ExceptionFromParallelEvaluationIsNotWrapped()
    {
        var density = new DelegateDensity(1, x => x[0] > 2 ? throw new InputException("bad value") : -0.5 * x[0] * x[0]);
        var sampler = new EnsembleSampler(density, new EnsembleSamplerOptions { Walkers = 8, Steps = 100000, MaxDegreeOfParallelism = 2 });
        Assert.Throws<InputException>(() => sampler.Run(Ball([0], 0.5, 8, 4)));
    }

    [Fact]
    public void ReportsProgressAndHonoursCancellation()
    {
        var target = new GaussianDensity([0, 0], Diagonal(2, 1.0));
        var progress = new ListProgress<SamplerProgress>();
        var run = new EnsembleSampler(target, new EnsembleSamplerOptions { Walkers = 8, Steps = 250, MaxDegreeOfParallelism = 1 })
            .Run(Ball([0, 0], 0.1, 8, 1), progress);
        Assert.InRange(progress.Reports.Count, 50, 260);
        Assert.Equal(250, progress.Reports[^1].Step);
        Assert.Equal(1.0, progress.Reports[^1].Fraction);
        Assert.True(progress.Reports.Zip(progress.Reports.Skip(1)).All(p => p.First.Step < p.Second.Step));
        Assert.Equal(8 + 250 * 8, run.Evaluations);

        using var cts = new CancellationTokenSource();
        var cancelling = new CancelAfter(cts, 3);
        Assert.ThrowsAny<OperationCanceledException>(() =>
            new EnsembleSampler(target, new EnsembleSamplerOptions { Walkers = 8, Steps = 10000 }).Run(Ball([0, 0], 0.1, 8, 1), cancelling, cts.Token));
    }

    [Fact]
    public void WritesChainToCsvAtomically()
    {
        var dir = Directory.CreateTempSubdirectory("sizetest-chain-").FullName;
        var path = Path.Combine(dir, "chain.csv");
        var target = new GaussianDensity([0, 0], Diagonal(2, 1.0));
        var options = new EnsembleSamplerOptions { Walkers = 6, Steps = 20, ParameterNames = ["omega_m", "size_evolution"] };
        using (var csv = new CsvChainStore(path, discard: 10, thin: 2))
        {
            var run = new EnsembleSampler(target, options).Run(Ball([0, 0], 0.1, 6, 1), store: csv);
            var lines = File.ReadAllLines(path);
            Assert.Equal("step,walker,log_prob,omega_m,size_evolution", lines[0]);
            Assert.Equal(1 + 5 * 6, lines.Length);                       // steps 10,12,…,18 × 6 walkers
            var last = lines[^1].Split(',');
            Assert.Equal("18", last[0]);
            Assert.Equal(run.Chain[18, 5, 1], double.Parse(last[4], System.Globalization.CultureInfo.InvariantCulture));
        }
        Assert.Single(Directory.GetFiles(dir));

        // A failed run leaves neither the target nor a temporary file.
        var failed = Path.Combine(dir, "failed.csv");
        using (var csv = new CsvChainStore(failed))
        {
            var bad = new DelegateDensity(1, x => x[0] > 2 ? double.NaN : -0.5 * x[0] * x[0]);
            Assert.Throws<AnalysisException>(() =>
                new EnsembleSampler(bad, new EnsembleSamplerOptions { Walkers = 4, Steps = 100000 }).Run(Ball([0], 0.5, 4, 1), store: csv));
        }
        Assert.False(File.Exists(failed));
        Assert.Single(Directory.GetFiles(dir));
    }

    [Fact]
    public void WritesChainThroughATextWriterWithAnOddWalkerCount()
    {
        // 7 walkers: halves of 3 and 4 (the split need not be even).
        var target = new GaussianDensity([0, 0, 0], Diagonal(3, 1.0));
        using var writer = new StringWriter();
        var store = new CsvChainStore(writer, thin: 5);
        var run = new EnsembleSampler(target, new EnsembleSamplerOptions { Walkers = 7, Steps = 50, BurnIn = 0 }).Run(Ball([0, 0, 0], 0.1, 7, 2), store: store);
        var lines = writer.ToString().Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal("step,walker,log_prob,theta_0,theta_1,theta_2", lines[0]);
        Assert.Equal(1 + 10 * 7, lines.Length);                     // steps 0, 5, …, 45
        var row = lines[1 + 7 * 3 + 6].Split(',');                    // step 15, walker 6
        Assert.Equal("15", row[0]);
        Assert.Equal(run.Chain.LogProbability(15, 6), double.Parse(row[2], System.Globalization.CultureInfo.InvariantCulture));
        Assert.Equal(7, run.WalkerAcceptanceFractions.Count);
    }

    [Fact]
    public void MemoryStoreDiscardsAndThins()
    {
        var target = new GaussianDensity([0], Diagonal(1, 1.0));
        var run = new EnsembleSampler(target, new EnsembleSamplerOptions { Walkers = 4, Steps = 11, BurnIn = 3, Thin = 3 }).Run(Ball([0], 0.5, 4, 1));
        Assert.Equal(11, run.Chain.Steps);
        Assert.Equal(3, run.Chain.KeptSteps(3, 3));                    // steps 3, 6, 9
        Assert.Equal(12, run.Samples.Length);
        Assert.Equal(run.Chain[6, 2, 0], run.Samples[1 * 4 + 2][0]);
        Assert.Equal(run.Chain.LogProbability(9, 1), run.Chain.GetFlatLogProbabilities(3, 3)[2 * 4 + 1]);
        Assert.Equal(3, run.Chain.GetChain(3, 3).Length);
        Assert.Equal(run.Chain.AcceptedCounts.Sum(), run.AcceptanceFraction * 4 * 11, 9);
    }

    [Fact]
    public void StartsNearAPriorBoundThroughLogPosterior()
    {
        // Likelihood peaked at the lower bound 0 of a uniform prior: a plain ball around 0.001 would put
        // walkers outside the support; the density-aware ball redraws them.
        var like = new DelegateDensity(2, x => -0.5 * ((x[0] - 0.001) * (x[0] - 0.001) / 1e-4 + x[1] * x[1]));
        var posterior = new LogPosterior(like, [new SizeTest.Inference.UniformPrior(0, 1), new SizeTest.Inference.UniformPrior(-5, 5)]);
        Assert.Equal(double.NegativeInfinity, posterior.LogDensity([-0.1, 0.0]));
        Assert.Equal(like.LogDensity([0.5, 0.2]) - Math.Log(10), posterior.LogDensity([0.5, 0.2]), 12);
        var start = EnsembleSampler.GaussianBall(posterior, [0.001, 0.0], [0.01, 0.01], 8, seed: 3);
        Assert.All(start, w => Assert.True(w[0] >= 0));
        var run = new EnsembleSampler(posterior, new EnsembleSamplerOptions { Walkers = 8, Steps = 300 }).Run(start);
        Assert.All(run.Samples, s => Assert.InRange(s[0], 0.0, 1.0));
        Assert.True(run.Percentile(0, 50) > 0);
    }

    private static double[,] Diagonal(int d, double v)
    {
        var m = new double[d, d];
        for (int i = 0; i < d; i++) m[i, i] = v;
        return m;
    }

    private sealed class CancelAfter(CancellationTokenSource cts, int reports) : IProgress<SamplerProgress>
    {
        private int _count;
        public void Report(SamplerProgress value) { if (++_count >= reports) cts.Cancel(); }
    }
}

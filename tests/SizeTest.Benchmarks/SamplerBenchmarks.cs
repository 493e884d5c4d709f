using System.Diagnostics;
using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Engines;
using SizeTest.Inference;
using SizeTest.Inference.Sampling;

namespace SizeTest.Benchmarks;

/// <summary>
/// Ensemble sampler and nested sampler timings. Target (issue 4): 32 walkers × 3000 steps with a
/// likelihood costing ~10 µs in ≤ 2 s on 2 cores. <c>Overhead_*</c> uses a 4-D Gaussian costing a
/// few ns, so its time is the sampler's own cost (divide by 3000 for the overhead per step);
/// <c>Dummy10us_*</c> spins for 10 µs per evaluation (96 032 evaluations = 0.96 s of work in serial).
/// Run: <c>dotnet run -c Release --project tests/SizeTest.Benchmarks -- --filter '*Sampler*'</c>.
/// </summary>
[SimpleJob(RunStrategy.Monitoring, launchCount: 1, warmupCount: 1, iterationCount: 5)]
[MemoryDiagnoser]
public class SamplerBenchmarks
{
    private static readonly double[] Centre = [0.3, 70.0, -1.0, 0.2];
    private double[][] _start = [];

    private EnsembleRun? _finished;

    [GlobalSetup]
    public void Setup()
    {
        _start = EnsembleSampler.GaussianBall(Centre, [0.01, 0.1, 0.01, 0.01], 32, seed: 1);
        _finished = Run(new CheapGaussian(), 1);
    }

    [Benchmark(Description = "diagnostics only: tau, R-hat, bulk/tail ESS of 32 walkers x 2250 steps x 4 parameters")]
    public double DiagnosticsOnly() => ChainDiagnostics.Compute(_finished!.Chain, _finished.BurnIn, null, _finished.AcceptanceFraction).MaxTau;

    private EnsembleRun Run(ILogDensity density, int threads) =>
        new EnsembleSampler(density, new EnsembleSamplerOptions { Walkers = 32, Steps = 3000, Seed = 1, MaxDegreeOfParallelism = threads }).Run(_start);

    [Benchmark(Description = "32x3000, cheap 4-D Gaussian, serial (sampler overhead)")]
    public double Overhead_Serial() => Run(new CheapGaussian(), 1).AcceptanceFraction;

    [Benchmark(Description = "32x3000, cheap 4-D Gaussian, 2 threads")]
    public double Overhead_TwoThreads() => Run(new CheapGaussian(), 2).AcceptanceFraction;

    [Benchmark(Description = "32x3000, 10 us density, serial")]
    public double Dummy10us_Serial() => Run(new SpinDensity(10.0), 1).AcceptanceFraction;

    [Benchmark(Description = "32x3000, 10 us density, 2 threads")]
    public double Dummy10us_TwoThreads() => Run(new SpinDensity(10.0), 2).AcceptanceFraction;

    [Benchmark(Description = "nested sampling, 400 live points, 4-D Gaussian")]
    public double Nested_4D()
    {
        var priors = new ParameterPrior[] { new UniformPrior(0, 1), new UniformPrior(60, 80), new UniformPrior(-3, 1), new UniformPrior(0, 1) };
        return new NestedSampler(new CheapGaussian(), priors, new NestedSamplerOptions { LivePoints = 400, Seed = 1 }).Run().LogEvidence;
    }

    /// <summary>Independent Gaussian around <see cref="Centre"/> with widths 0.05, 2, 0.3, 0.05.</summary>
    private sealed class CheapGaussian : ILogDensity
    {
        private static readonly double[] Sd = [0.05, 2.0, 0.3, 0.05];
        public int Dimension => 4;
        public double LogDensity(ReadOnlySpan<double> theta)
        {
            double s = 0;
            for (int i = 0; i < 4; i++)
            {
                double r = (theta[i] - Centre[i]) / Sd[i];
                s += r * r;
            }
            return -0.5 * s;
        }
    }

    /// <summary>The cheap Gaussian plus a busy wait of the given length (a stand-in for a real likelihood).</summary>
    private sealed class SpinDensity(double microseconds) : ILogDensity
    {
        private readonly long _ticks = (long)(microseconds * 1e-6 * Stopwatch.Frequency);
        private readonly CheapGaussian _inner = new();
        public int Dimension => 4;
        public double LogDensity(ReadOnlySpan<double> theta)
        {
            long end = Stopwatch.GetTimestamp() + _ticks;
            while (Stopwatch.GetTimestamp() < end) { }
            return _inner.LogDensity(theta);
        }
    }
}

using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Engines;
using SizeTest.Distributed;

namespace SizeTest.Benchmarks;

/// <summary>
/// One log-likelihood evaluation of the Gaussian grid kernel (issue 8 targets: 10^6 galaxies ≤ 3 ms,
/// 10^8 galaxies held in memory ≤ 0.3 s on 2 cores), including the per-parameter-vector model grid.
/// Run: <c>dotnet run -c Release --project tests/SizeTest.Benchmarks -- --filter '*Kernel*'</c>.
/// 10^8 rows take 2.4 GB (24 bytes per object).
/// </summary>
[SimpleJob(RunStrategy.Monitoring, launchCount: 1, warmupCount: 2, iterationCount: 10)]
public class KernelBenchmarks
{
    private KernelColumns _columns = null!;
    private double[] _distances = null!;
    private double[] _model = null!;

    /// <summary>Objects.</summary>
    [Params(1_000_000, 100_000_000)]
    public int N { get; set; }

    /// <summary>Threads (the machine has 2 cores).</summary>
    [Params(1, 2)]
    public int Threads { get; set; }

    /// <summary>Builds synthetic columns (SYNTHETIC rows, see <see cref="SyntheticKernelRows"/>).</summary>
    [GlobalSetup]
    public void Setup()
    {
        var grid = new LogRedshiftGrid(0.05, 3.0, 2048);
        var y = GC.AllocateUninitializedArray<double>(N);
        var s2 = GC.AllocateUninitializedArray<double>(N);
        var t = GC.AllocateUninitializedArray<double>(N);
        const int block = 1 << 16;
        Parallel.For(0, (N + block - 1) / block, b =>
        {
            int start = b * block, n = Math.Min(block, N - start);
            var z = new double[n]; var e = new double[n];
            SyntheticKernelRows.Fill(1, start, z, y.AsSpan(start, n), e);
            for (int i = 0; i < n; i++) { s2[start + i] = e[i] * e[i]; t[start + i] = grid.Position(z[i]); }
        });
        _columns = new KernelColumns(y, s2, t, grid);
        _distances = grid.Nodes.Select(SyntheticKernelRows.EdsAngularDiameterDistanceMpc).ToArray();
        _model = new double[grid.Count];
    }

    /// <summary>Model grid for one parameter vector, then the vectorised multi-core kernel.</summary>
    [Benchmark]
    public double Evaluate()
    {
        AngularSizeModelGrid.FillFromDistances(_columns.Grid, _distances, Math.Log(5), -1, _model);
        return GaussianGridKernel.LogLikelihoodParallel(_columns, 0, _columns.Count, _model, 0.2, Threads);
    }
}

/// <summary>The scalar reference and the vectorised evaluation at 10^6 objects, for comparison.</summary>
[SimpleJob(RunStrategy.Monitoring, launchCount: 1, warmupCount: 2, iterationCount: 10)]
public class KernelReferenceBenchmarks
{
    private KernelColumns _columns = null!;
    private double[] _model = null!;

    /// <summary>Builds 10^6 SYNTHETIC rows.</summary>
    [GlobalSetup]
    public void Setup()
    {
        const int n = 1_000_000;
        var grid = new LogRedshiftGrid(0.05, 3.0, 2048);
        var z = new double[n]; var y = new double[n]; var e = new double[n];
        SyntheticKernelRows.Fill(1, 0, z, y, e);
        _columns = KernelColumns.Build(z, y, e, grid);
        _model = new double[grid.Count];
        AngularSizeModelGrid.FillFromDistances(grid, grid.Nodes.Select(SyntheticKernelRows.EdsAngularDiameterDistanceMpc).ToArray(), Math.Log(5), -1, _model);
    }

    /// <summary>Plain scalar loop, one thread.</summary>
    [Benchmark(Baseline = true)]
    public double Scalar() => GaussianGridKernel.LogLikelihoodScalar(_columns, 0, _columns.Count, _model, 0.2);

    /// <summary>Vectorised, one thread.</summary>
    [Benchmark]
    public double VectorisedOneThread() => GaussianGridKernel.LogLikelihood(_columns, 0, _columns.Count, _model, 0.2);
}

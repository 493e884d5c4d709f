using BenchmarkDotNet.Attributes;
using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Photometry;

namespace SizeTest.Benchmarks;

/// <summary>
/// One log-likelihood evaluation of the angular-size model. Targets: ≤ 10 ms for 10⁶ galaxies; ≲ 15 µs for 2000
/// galaxies (so that 32 walkers × 3000 steps of MCMC fit in 2 s). "CosmologyFree" frees h0 so that D_A is
/// recomputed on the redshift grid every evaluation (the path an Ωm-free fit takes).
/// </summary>
[MemoryDiagnoser]
public class LikelihoodBenchmarks
{
    private HypothesisLikelihood _fixed = null!, _free = null!;
    private double[] _thFixed = [], _thFree = [];

    /// <summary>Number of galaxies.</summary>
    [Params(2000, 1_000_000)]
    public int N { get; set; }

    /// <summary>Builds a synthetic sample.</summary>
    [GlobalSetup]
    public void Setup()
    {
        var obs = BenchData.SizeSample(N, seed: 1);
        var nm = new NuisanceModel(ObservableKind.Size);
        _fixed = Hypothesis.Create(BenchData.Family, nm).Bind(obs);
        _free = Hypothesis.Create(BenchData.Family, nm, new ParameterOverrides(Free: new HashSet<string> { "h0" })).Bind(obs);
        _thFixed = _fixed.SuggestStart();
        _thFree = _free.SuggestStart();
    }

    /// <summary>Cosmology fixed: ln D_A precomputed per object.</summary>
    [Benchmark]
    public double CosmologyFixed() => _fixed.LogDensity(_thFixed);

    /// <summary>Cosmology free: D_A on the grid each call, cubic interpolation per object.</summary>
    [Benchmark]
    public double CosmologyFree() => _free.LogDensity(_thFree);
}

/// <summary>Synthetic data and a world model for the benchmarks.</summary>
public static class BenchData
{
    /// <summary>The world-model family used (flat ΛCDM from the registry).</summary>
    public static IWorldModelFamily Family => WorldModels.Get("lcdm");

    /// <summary>Family by name.</summary>
    public static IWorldModelFamily Get(string name) => WorldModels.Get(name);

    /// <summary>A synthetic (mock) angular-size sample: flat ΛCDM, R0 = 4 kpc, a = −1, 0.2 dex, 0.1 &lt; z &lt; 3.</summary>
    public static Observables SizeSample(int n, int seed)
    {
        var model = Family.Create(new Dictionary<string, double>());
        var rng = new Random(seed);
        var z = new double[n];
        for (int i = 0; i < n; i++) z[i] = 0.1 + 2.9 * rng.NextDouble();
        var sorted = (double[])z.Clone();
        Array.Sort(sorted);
        var grid = new double[256];
        for (int k = 0; k < grid.Length; k++) grid[k] = 0.09 + 2.92 * k / (grid.Length - 1.0);
        var da = new double[grid.Length];
        model.AngularDiameterDistances(grid, da);
        var y = new double[n];
        var e = new double[n];
        for (int i = 0; i < n; i++)
        {
            double d = Interp(grid, da, z[i]);
            double u1 = 1.0 - rng.NextDouble(), u2 = rng.NextDouble();
            double g = Math.Sqrt(-2 * Math.Log(u1)) * Math.Cos(2 * Math.PI * u2);
            y[i] = Math.Log(4e-3 * Math.Pow(1 + z[i], -1) / d) + Math.Log(10) * 0.2 * g;
            e[i] = 0.05;
        }
        return new Observables(z, y, e);
    }

    private static double Interp(double[] x, double[] y, double v)
    {
        int j = Math.Clamp(Array.BinarySearch(x, v) is var b && b < 0 ? ~b - 1 : b, 0, x.Length - 2);
        double t = (v - x[j]) / (x[j + 1] - x[j]);
        return y[j] + t * (y[j + 1] - y[j]);
    }
}

/// <summary>
/// A quick Stopwatch measurement of the same cases (for a loaded machine where BenchmarkDotNet takes too long):
/// run with <c>--filter *QuickTimings*</c>.
/// </summary>
public class LikelihoodQuickTimings
{
    /// <summary>Prints median timings to the console.</summary>
    [Benchmark]
    public void Print()
    {
        foreach (int n in new[] { 2000, 1_000_000 })
        {
            var b = new LikelihoodBenchmarks { N = n };
            b.Setup();
            var (fw, fc) = Time(() => b.CosmologyFixed(), n);
            var (gw, gc) = Time(() => b.CosmologyFree(), n);
            Console.WriteLine($"N={n}: fixed {fw:0.000} µs wall / {fc:0.000} µs CPU; free {gw:0.000} µs wall / {gc:0.000} µs CPU");
        }
        var f = new FitBenchmarks();
        f.Setup();
        var proc = System.Diagnostics.Process.GetCurrentProcess();
        var sw = System.Diagnostics.Stopwatch.StartNew();
        var c0 = proc.TotalProcessorTime;
        f.FourModelsMle();
        proc.Refresh();
        Console.WriteLine($"4 models MLE: {sw.Elapsed.TotalMilliseconds:0} ms wall, {(proc.TotalProcessorTime - c0).TotalMilliseconds:0} ms CPU");
        sw.Restart();
        c0 = proc.TotalProcessorTime;
        f.FourModelsWithBootstrap200();
        proc.Refresh();
        Console.WriteLine($"4 models MLE + 200 bootstrap: {sw.Elapsed.TotalMilliseconds:0} ms wall, {(proc.TotalProcessorTime - c0).TotalMilliseconds:0} ms CPU (all threads)");
    }

    // Median over 5 rounds of wall time per call, and process CPU time per call (robust on a shared, loaded machine).
    private static (double Wall, double Cpu) Time(Func<double> f, int n)
    {
        int reps = n > 100000 ? 30 : 3000;
        for (int i = 0; i < reps / 10; i++) f();
        var t = new double[5];
        var c = new double[5];
        var proc = System.Diagnostics.Process.GetCurrentProcess();
        for (int k = 0; k < 5; k++)
        {
            proc.Refresh();
            var c0 = proc.TotalProcessorTime;
            var sw = System.Diagnostics.Stopwatch.StartNew();
            for (int i = 0; i < reps; i++) f();
            t[k] = sw.Elapsed.TotalMicroseconds / reps;
            proc.Refresh();
            c[k] = (proc.TotalProcessorTime - c0).TotalMicroseconds / reps;
        }
        Array.Sort(t);
        Array.Sort(c);
        return (t[2], c[2]);
    }
}

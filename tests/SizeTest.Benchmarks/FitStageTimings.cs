using System.Diagnostics;
using BenchmarkDotNet.Attributes;
using SizeTest.Inference;
using SizeTest.Photometry;

namespace SizeTest.Benchmarks;

/// <summary>
/// Quick CPU-time harness for the fit's stages (<c>-- --fit-stages N</c>): one ln L and one ln L + gradient, the multi-start
/// L-BFGS-B fit with its Hessian, the mode search/interval refinement and the whole <see cref="FitRun"/> for flat ΛCDM with
/// Ωm free + static-linear, sizes, no cross-validation. Process CPU time (the shared machine's wall time is not meaningful).
/// </summary>
public static class FitStageTimings
{
    /// <summary>Runs the harness for <paramref name="args"/>[0] objects (default 200 000).</summary>
    public static void Run(string[] args, TextWriter output)
    {
        int n = args.Length > 0 ? int.Parse(args[0], System.Globalization.CultureInfo.InvariantCulture) : 200_000;
        var obs = BenchData.SizeSample(n, seed: 5);
        var nm = new NuisanceModel(ObservableKind.Size);
        var lcdm = Hypothesis.Create(BenchData.Get("lcdm"), nm, new ParameterOverrides(Free: new HashSet<string> { "omega_m" }));
        var stat = Hypothesis.Create(BenchData.Get("static-linear"), nm);
        var proc = Process.GetCurrentProcess();
        double Cpu() { proc.Refresh(); return proc.TotalProcessorTime.TotalMilliseconds; }
        void Time(string label, int repeat, Action a)
        {
            a();
            double c0 = Cpu(); var sw = Stopwatch.StartNew();
            for (int r = 0; r < repeat; r++) a();
            output.WriteLine($"{label,-48} {(Cpu() - c0) / repeat,10:F3} ms CPU  {sw.Elapsed.TotalMilliseconds / repeat,10:F3} ms wall");
        }
        output.WriteLine($"n = {n}, {Environment.ProcessorCount} cores");
        HypothesisLikelihood lik = null!;
        Time("bind lcdm (Ωm free)", 3, () => lik = lcdm.Bind(obs));
        var theta = lik.SuggestStart();
        var g = new double[theta.Length];
        Time("ln L", 20, () => lik.LogDensity(theta));
        Time("ln L + gradient", 20, () => lik.LogDensityAndGradient(theta, g));
        Time("  Prepare(θ) / Prepare(θ, gradient)", 20, () => lik.Prepare(theta));
        Time("  Prepare(θ, withGradient: true)", 20, () => lik.Prepare(theta, true));
        var e1 = lik.Prepare(theta, true)!;
        Time("  SumSlice, one thread", 10, () => lik.SumSlice(e1, 0, n));
        Time("  SumSliceWithGradient, one thread", 10, () => lik.SumSliceWithGradient(e1, 0, n, g));
        var sl = stat.Bind(obs);
        var ts = sl.SuggestStart();
        var gs = new double[ts.Length];
        Time("ln L + gradient, static-linear", 20, () => sl.LogDensityAndGradient(ts, gs));
        foreach (var (name, lk) in new[] { ("static-linear", sl), ("lcdm", lik) })
        {
            var fr = lk.Hypothesis.FreeParameters;
            var r = ProjectedLbfgs.Minimize((x, gg) => { double v = lk.Posterior.LogDensityAndGradient(x, gg); for (int j = 0; j < gg.Length; j++) gg[j] = -gg[j]; return double.IsFinite(v) ? -v : double.PositiveInfinity; },
                lk.SuggestStart(), fr.Select(p => p.Min).ToArray(), fr.Select(p => p.Max).ToArray());
            output.WriteLine($"  one L-BFGS-B run {name} from the suggested start (no H0): {r.Exit}, {r.Iterations} iterations, {r.Evaluations} evaluations, x = {string.Join(", ", r.X.Select(v => v.ToString("G6")))}");
        }
        MaximumLikelihoodResult fit = null!;
        Time("MLE lcdm (4 starts + Hessian)", 1, () => fit = MaximumLikelihood.Fit(lik));
        output.WriteLine($"  {fit.Evaluations} evaluations; {fit.ExitReason}");
        Time("MLE static-linear", 1, () => fit = MaximumLikelihood.Fit(sl));
        output.WriteLine($"  {fit.Evaluations} evaluations");
        var fl = MaximumLikelihood.Fit(lik);
        Time("refinement lcdm (mode scan, intervals)", 1, () => ModelFitRefinement.Run(lik, obs, fl));
        Time("FitRun lcdm + static-linear, no CV", 1, () => FitRun.Run(new FitRequest { Hypotheses = [lcdm, stat], Observables = obs }));
    }
}

/// <summary>ln L and ln L + gradient at survey size (BenchmarkDotNet), flat ΛCDM with Ωm free on the grid.</summary>
public class GradientBenchmarks
{
    private HypothesisLikelihood _lik = null!;
    private double[] _theta = null!, _grad = null!;

    /// <summary>Objects.</summary>
    [Params(200_000, 1_000_000)]
    public int N { get; set; }

    /// <summary>Builds the sample and the likelihood.</summary>
    [GlobalSetup]
    public void Setup()
    {
        var obs = BenchData.SizeSample(N, seed: 5);
        _lik = Hypothesis.Create(BenchData.Get("lcdm"), new NuisanceModel(ObservableKind.Size), new ParameterOverrides(Free: new HashSet<string> { "omega_m" })).Bind(obs);
        _theta = _lik.SuggestStart();
        _grad = new double[_theta.Length];
    }

    /// <summary>ln L alone.</summary>
    [Benchmark(Baseline = true)]
    public double LogDensity() => _lik.LogDensity(_theta);

    /// <summary>ln L with its analytic gradient.</summary>
    [Benchmark]
    public double LogDensityAndGradient() => _lik.LogDensityAndGradient(_theta, _grad);
}

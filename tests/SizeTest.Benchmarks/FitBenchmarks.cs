using BenchmarkDotNet.Attributes;
using SizeTest.Inference;
using SizeTest.Photometry;

namespace SizeTest.Benchmarks;

/// <summary>
/// Maximum likelihood of four world models with 200 bootstrap resamples each on 2000 galaxies.
/// Target: ≤ 3 s on the 2-core machine.
/// </summary>
public class FitBenchmarks
{
    private Observables _obs = null!;

    /// <summary>Builds the sample.</summary>
    [GlobalSetup]
    public void Setup() => _obs = BenchData.SizeSample(2000, seed: 2);

    /// <summary>One MLE per model (4 starts), no bootstrap.</summary>
    [Benchmark]
    public int FourModelsMle() => Run(0);

    /// <summary>The target: MLE + 200 bootstrap refits per model.</summary>
    [Benchmark]
    public int FourModelsWithBootstrap200() => Run(200);

    private int Run(int bootstrap)
    {
        var nm = new NuisanceModel(ObservableKind.Size);
        var hs = new[] { "lcdm", "eds", "static-linear", "tired-light" }.Select(n => Hypothesis.Create(BenchData.Get(n), nm)).ToArray();
        var r = FitRun.Run(new FitRequest { Hypotheses = hs, Observables = _obs, Bootstrap = bootstrap, Seed = 3 });
        return r.Models.Count;
    }
}

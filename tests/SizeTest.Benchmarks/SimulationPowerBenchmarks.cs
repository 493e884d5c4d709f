using System.Diagnostics;
using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Engines;
using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Simulation;

namespace SizeTest.Benchmarks;

/// <summary>
/// Target (issue 5): a power analysis of 200 mocks × 2000 galaxies × 4 models (MLE only) in ≤ 60 s on the project's
/// 2-core machine. One run per observable (it is long); the process CPU time is printed beside the wall time
/// because the shared machine's load makes wall time unrepresentative.
/// </summary>
[SimpleJob(RunStrategy.Monitoring, launchCount: 1, warmupCount: 0, iterationCount: 1)]
public class SimulationPowerBenchmarks
{
    private PowerRequest _request = null!;
    private TimeSpan _cpu;

    [Params("size", "joint")]
    public string Observable { get; set; } = "size";

    [GlobalSetup]
    public void Setup()
    {
        var model = WorldModels.Get("lcdm").Create(new Dictionary<string, double>());
        var spec = new MockSurveySpec(model, new SurveyDesign(2000, RedshiftDistribution.Uniform(0.1, 3), Selection: new MockSelection(SbLimit: 25)), 1);
        var kind = Observable == "size" ? ObservableKind.Size : ObservableKind.Joint;
        var nuisance = new NuisanceModel(kind, kind == ObservableKind.Joint ? new SelectionLimits(SbLimit: 25) : null);
        var candidates = new[] { "lcdm", "eds", "static-linear", "tired-light" }.Select(m => Hypothesis.Create(WorldModels.Get(m), nuisance)).ToArray();
        _request = new PowerRequest(spec, candidates, "lcdm", 200, [2000]);
    }

    [IterationSetup]
    public void Start() => _cpu = Process.GetCurrentProcess().TotalProcessorTime;

    [IterationCleanup]
    public void Stop() => Console.WriteLine($"// power {Observable}: process CPU time {(Process.GetCurrentProcess().TotalProcessorTime - _cpu).TotalSeconds:F1} s");

    [Benchmark]
    public int PowerAnalysis200x2000x4() => PowerAnalysis.Run(_request).Outcomes.Count;
}

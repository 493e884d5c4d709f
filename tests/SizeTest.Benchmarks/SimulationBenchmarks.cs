using BenchmarkDotNet.Attributes;
using SizeTest.Cosmology;
using SizeTest.Simulation;

namespace SizeTest.Benchmarks;

/// <summary>
/// Target (issue 5): simulating 10⁶ galaxies takes ≤ 1 s on the project's 2-core machine
/// (flat ΛCDM, survey N(z) peaking at z = 1, default errors, an SB limit at 24.5 mag/arcsec²).
/// </summary>
[MemoryDiagnoser]
public class SimulationBenchmarks
{
    private MockSurveySpec _spec = null!;

    [Params(1_000_000)]
    public int N { get; set; }

    [GlobalSetup]
    public void Setup()
    {
        var model = WorldModels.Get("lcdm").Create(new Dictionary<string, double>());
        _spec = new MockSurveySpec(model,
            new SurveyDesign(N, RedshiftDistribution.Survey(1.0), Errors: new MeasurementErrors(0.05, 0.01, 0.1, 0.0), Selection: new MockSelection(SbLimit: 24.5)),
            1);
    }

    [Benchmark]
    public int SimulateGalaxies() => MockSurveyGenerator.Generate(_spec).Count;

    [Benchmark]
    public int SimulateGalaxiesOneThread() => MockSurveyGenerator.Generate(_spec, parallel: false).Count;
}

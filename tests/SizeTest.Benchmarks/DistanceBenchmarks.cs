using BenchmarkDotNet.Attributes;
using SizeTest.Cosmology;

namespace SizeTest.Benchmarks;

/// <summary>
/// Fast vectorised distances (issue 2, item 5). Target: D_A for 10^6 redshifts uniform in
/// (0.01, 6) in ≤ 20 ms on one core for flat ΛCDM, curved ΛCDM, wCDM and flat ΛCDM with
/// radiation. The small-grid case is the fitter's path: a new model per parameter vector,
/// then D_A at 256 sorted grid redshifts (target: a few µs warm, tens of µs with the build).
/// Run: <c>dotnet run -c Release --project tests/SizeTest.Benchmarks -- --filter '*Distance*' --job short</c>.
/// </summary>
[MemoryDiagnoser]
public class DistanceBenchmarks
{
    private double[] _z = [];
    private double[] _result = [];
    private readonly double[] _grid = Enumerable.Range(0, 256).Select(i => 0.01 + i * (6.0 - 0.01) / 255).ToArray();
    private readonly double[] _gridResult = new double[256];
    private FlrwModel _model = null!;
    private double _omegaM = 0.3;

    /// <summary>Model under test.</summary>
    [Params("flat-lcdm", "curved-lcdm", "wcdm", "flat-lcdm-radiation")]
    public string Model { get; set; } = "flat-lcdm";

    /// <summary>Builds the redshifts (seeded) and the model; first call builds its tables.</summary>
    [GlobalSetup]
    public void Setup()
    {
        var rng = new Random(12345);
        _z = new double[1_000_000];
        for (int i = 0; i < _z.Length; i++) _z[i] = 0.01 + (6.0 - 0.01) * rng.NextDouble();
        _result = new double[_z.Length];
        _model = Create(Model, 0.3);
        _model.AngularDiameterDistances(_z, _result);
    }

    internal static FlrwModel Create(string name, double omegaM) => name switch
    {
        "flat-lcdm" => new LambdaCdmModel(70, omegaM),
        "curved-lcdm" => new LambdaCdmModel(70, omegaM, 0.8),
        "wcdm" => new WCdmModel(70, omegaM, -0.9),
        "flat-lcdm-radiation" => new LambdaCdmModel(70, omegaM, null, 2.7255, 3.046),
        _ => throw new ArgumentException(name),
    };

    /// <summary>10^6 unsorted redshifts, tables already built.</summary>
    [Benchmark]
    public void AngularDiameterMillion() => _model.AngularDiameterDistances(_z, _result);

    /// <summary>256 sorted grid redshifts on an existing model.</summary>
    [Benchmark]
    public void AngularDiameterGrid256Warm() => _model.AngularDiameterDistances(_grid, _gridResult);

    /// <summary>The fitter's step: a new model (new Ωm each time) and D_A at 256 grid redshifts.</summary>
    [Benchmark]
    public void CreateModelAndGrid256()
    {
        _omegaM = _omegaM > 0.35 ? 0.25 : _omegaM + 1e-7;
        Create(Model, _omegaM).AngularDiameterDistances(_grid, _gridResult);
    }
}

using BenchmarkDotNet.Attributes;
using SizeTest.Catalogues;
using SizeTest.Catalogues.Fits;
using SizeTest.Catalogues.Text;

namespace SizeTest.Benchmarks;

/// <summary>
/// Catalogue loading throughput at 10⁶ rows × 6 columns (z, z_err, theta, theta_err, mu, mu_err),
/// CSV and FITS, with allocations. Targets (issue 3, at 10⁷ rows; see <see cref="ReaderScaleHarness"/>):
/// ≥ 5·10⁵ rows/s CSV, ≥ 2·10⁶ rows/s FITS, ≤ 80 bytes per accepted row.
/// <c>dotnet run -c Release --project tests/SizeTest.Benchmarks -- --filter '*ReaderBenchmarks*' --job short</c>
/// </summary>
[MemoryDiagnoser]
public class ReaderBenchmarks
{
    private const int Rows = 1_000_000;
    private string _dir = "";

    [GlobalSetup]
    public void Setup()
    {
        _dir = Directory.CreateTempSubdirectory("sizetest-bench-").FullName;
        var rng = new Random(20261201);
        double[] Col(double lo, double hi) => Enumerable.Range(0, Rows).Select(_ => Math.Round(lo + (hi - lo) * rng.NextDouble(), 5)).ToArray();
        var t = new CatalogueTable("BENCH").AddReal("z", Col(0.01, 3)).AddReal("z_err", Col(0.001, 0.05)).AddReal("theta", Col(0.05, 2))
            .AddReal("theta_err", Col(0.001, 0.02)).AddReal("mu", Col(18, 26)).AddReal("mu_err", Col(0.02, 0.2));
        CsvTableWriter.Write(Path.Combine(_dir, "b.csv"), t);
        FitsTableWriter.Write(Path.Combine(_dir, "b.fits"), t);
    }

    [GlobalCleanup]
    public void Cleanup() => Directory.Delete(_dir, true);

    [Benchmark]
    public int LoadCsv() => CatalogueLoader.Load(Path.Combine(_dir, "b.csv")).Accepted;

    [Benchmark]
    public int LoadFits() => CatalogueLoader.Load(Path.Combine(_dir, "b.fits")).Accepted;
}

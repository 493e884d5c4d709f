using BenchmarkDotNet.Attributes;
using SizeTest.Catalogues;
using SizeTest.Photometry;

namespace SizeTest.Benchmarks.Photometry;

/// <summary>
/// Photometry costs. Targets: isophotal ln(r_iso/R_e) ≤ 10 ns per object (it sits inside the
/// likelihood); one template K(z) evaluation ≤ 1 ms; building observables with a template
/// K-correction for 10⁵ objects ≤ 1 s (grid of K(z), not per object).
/// </summary>
[MemoryDiagnoser]
public class PhotometryBenchmarks
{
    private double[] _mu = [];
    private double[] _iso = [];
    private double[] _out = [];
    private IsophotalSize _sersic = null!;
    private TemplateKCorrection _k = null!;
    private CatalogueRows _sample = null!;
    private PhotometryOptions _options = null!;

    /// <summary>Synthetic inputs.</summary>
    [GlobalSetup]
    public void Setup()
    {
        var rng = new Random(7);
        int n = 1_000_000;
        _mu = new double[n];
        _iso = new double[n];
        _out = new double[n];
        for (int i = 0; i < n; i++) { _mu[i] = 20 + 6 * rng.NextDouble(); _iso[i] = 25; }
        _sersic = new IsophotalSize(1.0);

        int m = 1200;
        var l = new double[m];
        var f = new double[m];
        for (int i = 0; i < m; i++) { l[i] = 300 * Math.Pow(200.0, i / (m - 1.0)); f[i] = Math.Pow(l[i], -1.2) * (1 + 0.3 * Math.Sin(l[i] / 400)); }
        var t = SpectralTable.FromColumns(l, f, SpectralDensity.PerWavelength, "synthetic");
        var r = Filter(6200, 400);
        var b = Filter(4400, 300);
        _k = new TemplateKCorrection(t, r, b);

        int nObj = 100_000;
        var z = new double[nObj];
        for (int i = 0; i < nObj; i++) z[i] = 0.01 + 2.0 * rng.NextDouble();
        _sample = new CatalogueRows("synthetic", Enumerable.Range(1, nObj).Select(i => (long)i).ToArray(), z, mu: z.Select(_ => 22.0).ToArray());
        _options = new PhotometryOptions { KCorrection = new KCorrectionOption.Template(t, r, b) };
    }

    private static FilterResponse Filter(double c, double s)
    {
        var l = new double[81];
        var v = new double[81];
        for (int i = 0; i < 81; i++) { l[i] = c + (i - 40) * s / 10; double x = (l[i] - c) / s; v[i] = i is 0 or 80 ? 0 : Math.Exp(-0.5 * x * x); }
        return FilterResponse.FromColumns(l, v, "g");
    }

    /// <summary>10⁶ isophotal ratios (vectorised API).</summary>
    [Benchmark]
    public int IsophotalMillion() => _sersic.LnRadiusRatios(_mu, _iso, _out);

    /// <summary>One template K(z).</summary>
    [Benchmark]
    public double TemplateKOnce() => _k.Evaluate(0.73);

    /// <summary>Observables for 10⁵ objects with a template K-correction.</summary>
    [Benchmark]
    public int Build100k() => ObservablesBuilder.Build(_sample, _options).Observables.Count;
}

using System.Diagnostics;
using System.Globalization;
using System.Text;
using SizeTest.Catalogues;
using SizeTest.Catalogues.Fits;

namespace SizeTest.Benchmarks;

/// <summary>
/// Stopwatch harness for the catalogue scale target (issue 3): a 10⁷-row, 6-column CSV and
/// FITS table must load at ≥ 5·10⁵ rows/s (CSV) and ≥ 2·10⁶ rows/s (FITS) with ≤ 80 bytes per
/// accepted row.
/// <code>
/// dotnet run -c Release --project tests/SizeTest.Benchmarks -- --reader-scale generate DIR [ROWS]
/// dotnet run -c Release --project tests/SizeTest.Benchmarks -- --reader-scale read DIR/scale.csv
/// dotnet run -c Release --project tests/SizeTest.Benchmarks -- --reader-scale read DIR/scale.fits
/// </code>
/// Run <c>read</c> in a fresh process per file so the peak working set belongs to that load alone.
/// Synthetic data: z, z_err, theta, theta_err, mu, mu_err drawn from a seeded generator.
/// </summary>
public static class ReaderScaleHarness
{
    public static void Run(string[] args)
    {
        if (args.Length >= 2 && args[0] == "generate") Generate(args[1], args.Length > 2 ? long.Parse(args[2], CultureInfo.InvariantCulture) : 10_000_000);
        else if (args.Length >= 2 && args[0] == "read") Read(args[1]);
        else Console.Error.WriteLine("usage: --reader-scale generate DIR [ROWS] | --reader-scale read FILE");
    }

    private static void Generate(string dir, long rows)
    {
        Directory.CreateDirectory(dir);
        var rng = new Random(20261201);
        int n = checked((int)rows);
        double[] z = new double[n], ze = new double[n], th = new double[n], te = new double[n], mu = new double[n], me = new double[n];
        for (int i = 0; i < n; i++)
        {
            z[i] = Math.Round(0.01 + 3 * rng.NextDouble(), 5);
            ze[i] = Math.Round(0.001 + 0.05 * rng.NextDouble(), 5);
            th[i] = Math.Round(0.05 + 2 * rng.NextDouble(), 5);
            te[i] = Math.Round(0.01 * th[i] + 0.001, 5);
            mu[i] = Math.Round(18 + 8 * rng.NextDouble(), 4);
            me[i] = Math.Round(0.02 + 0.2 * rng.NextDouble(), 4);
        }
        var sw = Stopwatch.StartNew();
        using (var w = new StreamWriter(Path.Combine(dir, "scale.csv"), false, new UTF8Encoding(false), 1 << 20))
        {
            w.Write("# synthetic scale-test catalogue (seed 20261201)\nz,z_err,theta,theta_err,mu,mu_err\n");
            for (int i = 0; i < n; i++)
            {
                w.Write(z[i].ToString(CultureInfo.InvariantCulture)); w.Write(',');
                w.Write(ze[i].ToString(CultureInfo.InvariantCulture)); w.Write(',');
                w.Write(th[i].ToString(CultureInfo.InvariantCulture)); w.Write(',');
                w.Write(te[i].ToString(CultureInfo.InvariantCulture)); w.Write(',');
                w.Write(mu[i].ToString(CultureInfo.InvariantCulture)); w.Write(',');
                w.Write(me[i].ToString(CultureInfo.InvariantCulture)); w.Write('\n');
            }
        }
        Console.WriteLine($"wrote scale.csv in {sw.Elapsed.TotalSeconds:F1} s");
        sw.Restart();
        var table = new CatalogueTable("SCALE").AddReal("z", z).AddReal("z_err", ze).AddReal("theta", th, "arcsec")
            .AddReal("theta_err", te, "arcsec").AddReal("mu", mu, "mag.arcsec-2").AddReal("mu_err", me, "mag.arcsec-2");
        FitsTableWriter.Write(Path.Combine(dir, "scale.fits"), table);
        Console.WriteLine($"wrote scale.fits in {sw.Elapsed.TotalSeconds:F1} s");
    }

    private static void Read(string path)
    {
        var proc = Process.GetCurrentProcess();
        GC.Collect();
        proc.Refresh();
        long wsBefore = proc.WorkingSet64;
        long allocBefore = GC.GetTotalAllocatedBytes(true);
        var cpuBefore = proc.TotalProcessorTime;
        var sw = Stopwatch.StartNew();
        var load = CatalogueLoader.Load(path);
        sw.Stop();
        long allocated = GC.GetTotalAllocatedBytes(true) - allocBefore;
        proc.Refresh();
        long peak = proc.PeakWorkingSet64;
        var cpu = proc.TotalProcessorTime - cpuBefore;
        long retained = GC.GetTotalMemory(true);
        double rate = load.RowsRead / sw.Elapsed.TotalSeconds;
        Console.WriteLine($"file {Path.GetFileName(path)} ({new FileInfo(path).Length / 1e6:F0} MB), format {load.Format}");
        Console.WriteLine($"rows read {load.RowsRead}, accepted {load.Accepted}, rejected {load.Rejected}; roles {string.Join(",", load.Mapping.Roles.Keys.Select(r => r.Name()))}");
        Console.WriteLine($"wall {sw.Elapsed.TotalSeconds:F2} s, cpu {cpu.TotalSeconds:F2} s -> {rate:F0} rows/s (wall), {load.RowsRead / cpu.TotalSeconds:F0} rows/s (cpu)");
        Console.WriteLine($"allocated during load {allocated / 1e6:F1} MB = {(double)allocated / load.Accepted:F1} bytes/accepted row");
        Console.WriteLine($"retained after load (GC heap) {retained / 1e6:F1} MB = {(double)retained / load.Accepted:F1} bytes/accepted row");
        Console.WriteLine($"peak working set {peak / 1e6:F0} MB (before load {wsBefore / 1e6:F0} MB) -> {(double)(peak - wsBefore) / load.Accepted:F1} bytes/accepted row above the baseline");
        Console.WriteLine($"machine load average: {File.ReadAllText("/proc/loadavg").Trim()}");
        GC.KeepAlive(load);
    }
}

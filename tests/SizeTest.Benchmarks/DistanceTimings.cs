using System.Diagnostics;
using System.Runtime.InteropServices;
using SizeTest.Cosmology;

namespace SizeTest.Benchmarks;

/// <summary>
/// A quick harness for the distance targets that measures thread CPU time (so the figures
/// mean "one core" even on a busy machine) and wall time, best of several repetitions, and
/// the accuracy against adaptive quadrature. Run:
/// <c>dotnet run -c Release --project tests/SizeTest.Benchmarks -- --distance-timings</c>.
/// </summary>
public static class DistanceTimings
{
    [DllImport("libc", EntryPoint = "clock_gettime")]
    private static extern int ClockGetTime(int clock, out TimeSpec value);

    [StructLayout(LayoutKind.Sequential)]
    private struct TimeSpec
    {
        public long Seconds;
        public long Nanoseconds;
    }

    private static double ThreadCpuSeconds()
    {
        if (!OperatingSystem.IsLinux()) return Stopwatch.GetTimestamp() / (double)Stopwatch.Frequency;
        ClockGetTime(3, out var t); // CLOCK_THREAD_CPUTIME_ID
        return t.Seconds + t.Nanoseconds * 1e-9;
    }

    /// <summary>Prints one line per model and case.</summary>
    public static void Run(TextWriter output)
    {
        var rng = new Random(12345);
        var z = new double[1_000_000];
        for (int i = 0; i < z.Length; i++) z[i] = 0.01 + (6.0 - 0.01) * rng.NextDouble();
        var r = new double[z.Length];
        var grid = Enumerable.Range(0, 256).Select(i => 0.01 + i * (6.0 - 0.01) / 255).ToArray();
        var gridResult = new double[256];
        output.WriteLine("model                 1e6 D_A cpu ms  wall ms   max rel err   grid256 warm us  new model+grid256 us");
        foreach (string name in new[] { "flat-lcdm", "curved-lcdm", "wcdm", "flat-lcdm-radiation" })
        {
            var m = DistanceBenchmarks.Create(name, 0.3);
            m.AngularDiameterDistances(z, r);
            double bestCpu = double.MaxValue, bestWall = double.MaxValue;
            for (int rep = 0; rep < 9; rep++)
            {
                double c0 = ThreadCpuSeconds();
                long w0 = Stopwatch.GetTimestamp();
                m.AngularDiameterDistances(z, r);
                bestWall = Math.Min(bestWall, Stopwatch.GetElapsedTime(w0).TotalSeconds);
                bestCpu = Math.Min(bestCpu, ThreadCpuSeconds() - c0);
            }
            double worst = 0;
            for (int i = 0; i < z.Length; i += 1000)
                worst = Math.Max(worst, Math.Abs(r[i] / m.AngularDiameterDistanceByQuadrature(z[i]) - 1));
            const int reps = 20000;
            for (int k = 0; k < 1000; k++) m.AngularDiameterDistances(grid, gridResult);
            double g0 = ThreadCpuSeconds();
            for (int k = 0; k < reps; k++) m.AngularDiameterDistances(grid, gridResult);
            double warmUs = (ThreadCpuSeconds() - g0) / reps * 1e6;
            double n0 = ThreadCpuSeconds();
            for (int k = 0; k < reps; k++) DistanceBenchmarks.Create(name, 0.25 + k * 5e-6).AngularDiameterDistances(grid, gridResult);
            double coldUs = (ThreadCpuSeconds() - n0) / reps * 1e6;
            output.WriteLine($"{name,-20}  {bestCpu * 1e3,14:F1}  {bestWall * 1e3,7:F1}   {worst,11:E1}   {warmUs,15:F2}  {coldUs,20:F2}");
        }
    }
}

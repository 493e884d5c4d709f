using BenchmarkDotNet.Running;

namespace SizeTest.Benchmarks;

/// <summary>
/// Runs the benchmarks: <c>dotnet run -c Release --project tests/SizeTest.Benchmarks -- --filter '*'</c>.
/// Each benchmark class states the target it checks (see DEVELOPERS.md).
/// </summary>
public static class Program
{
    /// <summary>Entry point; arguments go to BenchmarkDotNet's switcher.</summary>
    public static void Main(string[] args)
    {
        if (args is ["--distance-timings"]) { DistanceTimings.Run(Console.Out); return; } // quick CPU-time harness (DistanceTimings.cs)
        if (args.Length > 0 && args[0] == "--interval-coverage") { IntervalCoverageHarness.Run(args[1..], Console.Out); return; }
        if (args.Length > 0 && args[0] == "--mcmc-timing") { McmcTiming.Run(args[1..], Console.Out); return; }
        if (args.Length > 0 && args[0] == "--fit-stages") { FitStageTimings.Run(args[1..], Console.Out); return; }
        if (args.Length > 0 && args[0] == "--photoz-cost") { PhotoZCost.Run(args[1..], Console.Out); return; }
        if (args.Length > 0 && args[0] == "--nested-calibration") { NestedCalibration.Run(args[1..], Console.Out); return; }
        if (args.Length > 0 && args[0] == "--reader-scale") { ReaderScaleHarness.Run(args[1..]); return; }
        BenchmarkSwitcher.FromAssembly(typeof(Program).Assembly).Run(args);
    }
}

using System.Diagnostics;

namespace SizeTest.Foundation.Profiling;

/// <summary>
/// A stopwatch log of named stages (wall and process CPU seconds since the previous mark), for profiling where a run's
/// time goes. Records only; the caller decides whether to print (the CLI does when <see cref="EnvironmentVariable"/> is 1).
/// Thread-safe.
/// </summary>
public sealed class StageTimings
{
    /// <summary>The environment variable that turns the CLI's stage log on (<c>SIZETEST_TIMINGS=1</c>: lines on standard error).</summary>
    public const string EnvironmentVariable = "SIZETEST_TIMINGS";

    private readonly object _gate = new();
    private readonly Stopwatch _clock = Stopwatch.StartNew();
    private readonly List<(string Stage, double Wall, double Cpu)> _entries = [];
    private double _lastWall, _lastCpu = Cpu();

    /// <summary>Whether the environment asks for the stage log.</summary>
    public static bool Requested => Environment.GetEnvironmentVariable(EnvironmentVariable) == "1";

    /// <summary>Ends stage <paramref name="stage"/> now: records the wall and CPU time since the previous mark (or creation).</summary>
    public void Mark(string stage)
    {
        lock (_gate)
        {
            double wall = _clock.Elapsed.TotalSeconds, cpu = Cpu();
            _entries.Add((stage, wall - _lastWall, cpu - _lastCpu));
            _lastWall = wall;
            _lastCpu = cpu;
        }
    }

    /// <summary>The stages so far, in order: name, wall seconds, process CPU seconds.</summary>
    public IReadOnlyList<(string Stage, double Wall, double Cpu)> Entries
    {
        get { lock (_gate) return _entries.ToArray(); }
    }

    private static double Cpu() => Process.GetCurrentProcess().TotalProcessorTime.TotalSeconds;
}

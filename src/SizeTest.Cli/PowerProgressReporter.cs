using SizeTest.Simulation;

namespace SizeTest.Cli;

/// <summary>
/// Shows power-analysis progress on standard error: a bar that redraws itself on a terminal, and a plain line at
/// every 10 % otherwise (redirected output, CI). Thread-safe: mocks report from worker threads.
/// </summary>
internal sealed class PowerProgressReporter(CliContext context) : IProgress<PowerProgress>
{
    private readonly object _gate = new();
    private int _lastTenth = -1;
    private readonly System.Diagnostics.Stopwatch _clock = System.Diagnostics.Stopwatch.StartNew();

    public void Report(PowerProgress value)
    {
        lock (_gate)
        {
            int total = Math.Max(1, value.Total);
            if (context.IsInteractive)
            {
                const int width = 30;
                int filled = (int)((long)width * value.Done / total);
                context.Err.Write($"\rsizetest power: [{new string('#', filled)}{new string('.', width - filled)}] {value.Done}/{value.Total} mocks, {_clock.Elapsed.TotalSeconds:F0} s ");
                if (value.Done >= value.Total) context.Err.WriteLine();
                return;
            }
            int tenth = (int)(10L * value.Done / total);
            if (tenth <= _lastTenth) return;
            _lastTenth = tenth;
            context.Err.WriteLine(FormattableString.Invariant($"sizetest power: {value.Done}/{value.Total} mocks fitted ({_clock.Elapsed.TotalSeconds:F1} s)"));
        }
    }
}

namespace SizeTest.Cli;

/// <summary>
/// Shows fit progress on standard error: a self-overwriting line on a terminal, plain lines at each stage start and
/// every 25% otherwise (redirected output, CI). Thread-safe (bootstrap workers report from several threads).
/// </summary>
internal sealed class FitProgressReporter(CliContext context) : IProgress<Inference.FitProgress>
{
    private readonly object _gate = new();
    private string _stage = "";
    private int _lastQuarter = -1;
    private readonly System.Diagnostics.Stopwatch _sinceLine = System.Diagnostics.Stopwatch.StartNew();

    public void Report(Inference.FitProgress value)
    {
        lock (_gate)
        {
            if (context.IsInteractive)
            {
                string bar = value.Total > 0 ? $" {value.Done}/{value.Total}" : "";
                string more = value.Detail is { } d ? $" ({d})" : "";
                context.Err.Write($"\r{value.Stage}{bar}{more}".PadRight(60));
                if (value.Done >= value.Total && value.Stage.StartsWith("fitted", StringComparison.Ordinal)) context.Err.Write("\r" + new string(' ', 60) + "\r");
                return;
            }
            if (value.Stage.StartsWith("fitted", StringComparison.Ordinal)) return;
            if (value.Stage != _stage)
            {
                _stage = value.Stage;
                _lastQuarter = -1;
                if (!value.Stage.StartsWith("bootstrap", StringComparison.Ordinal)) { context.Err.WriteLine($"sizetest fit: {value.Stage}"); return; }
            }
            int quarter = value.Total > 0 ? 4 * value.Done / value.Total : 4;
            // Plain lines: at each quarter, and for a long stage (a sampler run to convergence, whose total grows) every 10 s.
            if (quarter > _lastQuarter || (value.Detail is not null && _sinceLine.Elapsed.TotalSeconds >= 10))
            {
                _lastQuarter = Math.Max(_lastQuarter, quarter);
                _sinceLine.Restart();
                string more = value.Detail is { } d ? $" ({d})" : "";
                context.Err.WriteLine($"sizetest fit: {value.Stage} {value.Done}/{value.Total}{more}");
            }
        }
    }
}

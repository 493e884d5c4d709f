using System.Runtime.InteropServices;
using SizeTest.Foundation.Files;

namespace SizeTest.Cli;

/// <summary>
/// Removes this process's staging folders and temporary files (<see cref="StagingRegistry"/>) when it is
/// interrupted (SIGINT, Ctrl+C), terminated (SIGTERM) or exits, so an interrupted run leaves nothing staged
/// behind and the previous output untouched. Exit codes follow the shell convention 128 + signal
/// (130 for SIGINT, 143 for SIGTERM).
/// </summary>
internal sealed class InterruptCleanup : IDisposable
{
    private readonly List<IDisposable> _registrations = new();

    private InterruptCleanup() { }

    /// <summary>Installs the handlers for the life of the returned object.</summary>
    public static InterruptCleanup Install()
    {
        var c = new InterruptCleanup();
        AppDomain.CurrentDomain.ProcessExit += OnExit;
        try
        {
            c._registrations.Add(PosixSignalRegistration.Create(PosixSignal.SIGINT, ctx => Stop(ctx, 130)));
            c._registrations.Add(PosixSignalRegistration.Create(PosixSignal.SIGTERM, ctx => Stop(ctx, 143)));
        }
        catch (PlatformNotSupportedException)
        {
            Console.CancelKeyPress += (_, e) => { StagingRegistry.RemoveAll(); e.Cancel = false; };
        }
        return c;
    }

    private static void Stop(PosixSignalContext ctx, int exitCode)
    {
        ctx.Cancel = true;
        // Environment.Exit runs the process-exit handlers while the work threads go on; should one of them
        // hold the exit up, the process still ends with the signal's exit code, staging already removed.
        new Thread(() => { Thread.Sleep(TimeSpan.FromSeconds(10)); StagingRegistry.RemoveAll(); ExitNow(exitCode); }) { IsBackground = true }.Start();
        StagingRegistry.RemoveAll();
        try { Console.Error.WriteLine($"sizetest: interrupted ({ctx.Signal}); staging files removed, earlier output left as it was"); }
        catch (IOException) { }
        Environment.Exit(exitCode);
    }

    [DllImport("libc", EntryPoint = "_exit")]
    private static extern void ExitNow(int status);

    private static void OnExit(object? sender, EventArgs e) => StagingRegistry.RemoveAll();

    public void Dispose()
    {
        foreach (var r in _registrations) r.Dispose();
        AppDomain.CurrentDomain.ProcessExit -= OnExit;
    }
}

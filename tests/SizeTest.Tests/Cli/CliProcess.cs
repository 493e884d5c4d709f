using System.Diagnostics;
using System.Runtime.InteropServices;
using Xunit;

namespace SizeTest.Tests.Cli;

/// <summary>
/// Runs <c>dotnet sizetest.dll …</c> as a real process (own working directory, signals, peak memory),
/// for the tests that in-process runs cannot do.
/// </summary>
internal static class CliProcess
{
    public static string SizetestDll => Path.Combine(AppContext.BaseDirectory, "sizetest.dll");

    public static string DotnetHost => Environment.GetEnvironmentVariable("DOTNET_HOST_PATH") is { Length: > 0 } p && File.Exists(p) ? p : "dotnet";

    public static ProcessStartInfo Info(string? workingDirectory, params string[] args)
    {
        var psi = new ProcessStartInfo(DotnetHost) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        if (workingDirectory is not null) psi.WorkingDirectory = workingDirectory;
        psi.ArgumentList.Add(SizetestDll);
        foreach (var a in args) psi.ArgumentList.Add(a);
        foreach (var name in SizeTest.Distributed.LauncherEnvironment.LauncherVariables) psi.Environment.Remove(name);
        psi.Environment["CI"] = "true";
        return psi;
    }

    /// <summary>Runs to the end (at most <paramref name="timeoutSeconds"/>); returns exit code, output and peak RSS (VmHWM, bytes; 0 when unknown).</summary>
    public static (int Exit, string Out, string Err, long PeakRssBytes) Run(string? workingDirectory, string[] args, int timeoutSeconds = 120)
    {
        using var p = Process.Start(Info(workingDirectory, args))!;
        var stdout = p.StandardOutput.ReadToEndAsync();
        var stderr = p.StandardError.ReadToEndAsync();
        long peak = 0;
        var sw = Stopwatch.StartNew();
        while (!p.WaitForExit(20))
        {
            peak = Math.Max(peak, PeakRss(p.Id));
            if (sw.Elapsed.TotalSeconds > timeoutSeconds)
            {
                try { p.Kill(entireProcessTree: true); } catch (InvalidOperationException) { }
                p.WaitForExit();
                Assert.Fail($"sizetest {string.Join(' ', args)} did not finish within {timeoutSeconds} s and was killed.");
            }
        }
        p.WaitForExit();
        return (p.ExitCode, stdout.Result, stderr.Result, peak);
    }

    /// <summary>VmHWM (peak resident set) of a live process from /proc/PID/status, bytes; 0 when not readable.</summary>
    public static long PeakRss(int pid)
    {
        try
        {
            foreach (var line in File.ReadLines($"/proc/{pid}/status"))
                if (line.StartsWith("VmHWM:", StringComparison.Ordinal))
                    return long.Parse(line[6..].Trim().Split(' ')[0], System.Globalization.CultureInfo.InvariantCulture) * 1024;
        }
        catch (IOException) { }
        catch (UnauthorizedAccessException) { }
        return 0;
    }

    [DllImport("libc", SetLastError = true, EntryPoint = "kill")]
    private static extern int SysKill(int pid, int sig);

    /// <summary>Sends signal <paramref name="signal"/> (2 = SIGINT, 15 = SIGTERM) to <paramref name="pid"/>.</summary>
    public static void Signal(int pid, int signal) => Assert.Equal(0, SysKill(pid, signal));
}

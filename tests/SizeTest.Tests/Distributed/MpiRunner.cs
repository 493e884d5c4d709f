using System.Diagnostics;
using Xunit;

namespace SizeTest.Tests.Distributed;

/// <summary>Launches the built <c>sizetest.dll</c> under <c>mpirun</c> (Open MPI) with a hard timeout.</summary>
internal static class MpiRunner
{
    public static readonly TimeSpan Timeout = TimeSpan.FromSeconds(240);

    /// <summary>Full path of mpirun on PATH, or null.</summary>
    public static string? FindMpirun()
    {
        foreach (var dir in (Environment.GetEnvironmentVariable("PATH") ?? "").Split(Path.PathSeparator))
        {
            if (dir.Length == 0) continue;
            var candidate = Path.Combine(dir, "mpirun");
            if (File.Exists(candidate)) return candidate;
        }
        return null;
    }

    public static string SizetestDll => Path.Combine(AppContext.BaseDirectory, "sizetest.dll");

    public static string DotnetHost => Environment.GetEnvironmentVariable("DOTNET_HOST_PATH") is { Length: > 0 } p && File.Exists(p) ? p : "dotnet";

    /// <summary>Runs <c>mpirun -np N dotnet sizetest.dll args</c>; kills the whole process tree after <see cref="Timeout"/>.</summary>
    public static (int Exit, string Out, string Err) Run(int ranks, params string[] args)
    {
        var mpirun = FindMpirun() ?? throw new InvalidOperationException("mpirun not found");
        var psi = new ProcessStartInfo(mpirun) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        foreach (var a in new[] { "--allow-run-as-root", "--oversubscribe", "-np", ranks.ToString(), "-x", "TERM=dumb", DotnetHost, SizetestDll })
            psi.ArgumentList.Add(a);
        foreach (var a in args) psi.ArgumentList.Add(a);
        return RunProcess(psi);
    }

    /// <summary>Runs <c>dotnet sizetest.dll args</c> as a plain process with extra environment variables.</summary>
    public static (int Exit, string Out, string Err) RunPlain(IReadOnlyDictionary<string, string> environment, params string[] args)
    {
        var psi = new ProcessStartInfo(DotnetHost) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        psi.ArgumentList.Add(SizetestDll);
        foreach (var a in args) psi.ArgumentList.Add(a);
        foreach (var (k, v) in environment) psi.Environment[k] = v;
        return RunProcess(psi);
    }

    private static (int, string, string) RunProcess(ProcessStartInfo psi)
    {
        // Launcher variables of an enclosing job must not leak into the child.
        foreach (var name in SizeTest.Distributed.LauncherEnvironment.LauncherVariables)
            if (!psi.Environment.ContainsKey(name) || Environment.GetEnvironmentVariable(name) == psi.Environment[name]) psi.Environment.Remove(name);
        using var p = Process.Start(psi)!;
        var stdout = p.StandardOutput.ReadToEndAsync();
        var stderr = p.StandardError.ReadToEndAsync();
        if (!p.WaitForExit(Timeout))
        {
            try { p.Kill(entireProcessTree: true); } catch (InvalidOperationException) { }
            p.WaitForExit();
            Assert.Fail($"'{psi.FileName} {string.Join(' ', psi.ArgumentList)}' did not finish within {Timeout.TotalSeconds} s and was killed.");
        }
        p.WaitForExit();
        return (p.ExitCode, stdout.Result, stderr.Result);
    }
}

/// <summary>A fact that is skipped, with a message saying why, when mpirun is not installed.</summary>
public sealed class MpiFactAttribute : FactAttribute
{
    public MpiFactAttribute()
    {
        if (MpiRunner.FindMpirun() is null) Skip = "mpirun not found on PATH: install Open MPI (Debian: openmpi-bin libopenmpi-dev) to run the MPI tests.";
    }
}

using System.Diagnostics;
using System.Reflection;

namespace SizeTest.Cli;

/// <summary>
/// The version and git commit of this build. The commit is embedded at build time: the .NET SDK's source-control
/// support sets <c>SourceRevisionId</c> from the repository and appends it to the informational version
/// ("0.1.0+&lt;commit&gt;"; Directory.Build.props keeps that on), so the manifest is right wherever SizeTest runs.
/// Fallbacks, in order: <c>git rev-parse HEAD</c> in the executable's own folder (a build made without git
/// metadata but run inside a checkout), then "unknown".
/// </summary>
internal static class BuildInfo
{
    private static string Informational =>
        typeof(SizeTest.Studies.StudyRunner).Assembly.GetCustomAttribute<AssemblyInformationalVersionAttribute>()?.InformationalVersion ?? "";

    /// <summary>The version without the commit suffix (e.g. 0.1.0).</summary>
    public static string Version =>
        Informational.Length > 0 ? Informational.Split('+')[0] : typeof(SizeTest.Studies.StudyRunner).Assembly.GetName().Version?.ToString() ?? "unknown";

    /// <summary>The commit the library was built from (40 hex digits), or "unknown".</summary>
    public static string Commit { get; } = FindCommit();

    private static string FindCommit()
    {
        int plus = Informational.IndexOf('+', StringComparison.Ordinal);
        if (plus >= 0)
        {
            var id = Informational[(plus + 1)..].Split('.')[0];
            if (id.Length >= 7 && id.All(Uri.IsHexDigit)) return id;
        }
        return GitHead(AppContext.BaseDirectory) ?? "unknown";
    }

    private static string? GitHead(string directory)
    {
        try
        {
            var psi = new ProcessStartInfo("git", "rev-parse HEAD")
            {
                RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false, WorkingDirectory = directory,
            };
            using var p = Process.Start(psi);
            if (p is null) return null;
            var text = p.StandardOutput.ReadToEnd().Trim();
            p.WaitForExit(5000);
            return p.ExitCode == 0 && text.Length >= 7 ? text : null;
        }
        catch (Exception e) when (e is System.ComponentModel.Win32Exception or InvalidOperationException or IOException)
        {
            return null;
        }
    }
}

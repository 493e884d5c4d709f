using System.Diagnostics;
using Xunit;

namespace SizeTest.Tests.Reporting;

/// <summary>Finds and runs external programs (chromium, pdftotext, pdftoppm, pdfinfo) for the report checks.</summary>
internal static class ExternalTool
{
    public static string? Find(string name)
    {
        foreach (var dir in (Environment.GetEnvironmentVariable("PATH") ?? "").Split(Path.PathSeparator).Append("/usr/bin"))
        {
            var p = Path.Combine(dir, name);
            if (File.Exists(p)) return p;
        }
        return null;
    }

    /// <summary>pdftotext of <paramref name="pdf"/> (written to a temporary file) with <paramref name="args"/> before the path.</summary>
    public static string PdfText(byte[] pdf, params string[] args)
    {
        var dir = Directory.CreateTempSubdirectory("sizetest-pdftext-");
        try
        {
            var path = Path.Combine(dir.FullName, "r.pdf");
            File.WriteAllBytes(path, pdf);
            return Run("pdftotext", [.. args, path, "-"]).Stdout;
        }
        finally { dir.Delete(true); }
    }

    public static (int Exit, string Stdout, string Stderr) Run(string tool, IEnumerable<string> args, int timeoutMs = 120_000)
    {
        var psi = new ProcessStartInfo(Find(tool) ?? tool) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        foreach (var a in args) psi.ArgumentList.Add(a);
        using var p = Process.Start(psi)!;
        var so = p.StandardOutput.ReadToEndAsync();
        var se = p.StandardError.ReadToEndAsync();
        if (!p.WaitForExit(timeoutMs)) { try { p.Kill(true); } catch (InvalidOperationException) { } throw new TimeoutException($"{tool} did not finish in {timeoutMs / 1000} s"); }
        p.WaitForExit();
        return (p.ExitCode, so.Result, se.Result);
    }
}

/// <summary>A fact that is skipped, with a message naming the missing program, when a tool is not installed (CI installs them all).</summary>
public sealed class ToolFactAttribute : FactAttribute
{
    public ToolFactAttribute(params string[] tools)
    {
        var missing = tools.Where(t => ExternalTool.Find(t) is null).ToList();
        if (missing.Count > 0)
            Skip = $"needs {string.Join(", ", missing)} (Debian packages chromium / poppler-utils; .ci/run installs them)";
    }
}

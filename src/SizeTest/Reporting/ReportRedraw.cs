using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Files;
using SizeTest.Reporting.Data;
using SizeTest.Reporting.Pack;

namespace SizeTest.Reporting;

/// <summary>
/// Redraws a report folder from its saved <c>report-data.json</c> without refitting: figures,
/// tables, <c>report.html</c>, <c>report.pdf</c> and <c>manifest.json</c> are written again and
/// every other file of the folder (results.json, report-data.json, reject logs, …) is carried
/// over unchanged. The new folder is built beside the target and swapped in when complete.
/// </summary>
public static class ReportRedraw
{
    /// <summary>Files and folders a redraw writes (everything else in the folder is kept).</summary>
    public static IReadOnlyList<string> ReportOutputs { get; } = ["figures", "tables", "report.html", "report.pdf", "manifest.json", ReportDataJson.FileName];

    /// <summary>
    /// Redraws the report in <paramref name="reportDir"/> in place, or into
    /// <paramref name="outDir"/> when given (which, if it exists and is not empty, needs
    /// <paramref name="force"/>). Returns the target folder and the report files written.
    /// </summary>
    public static (string Target, IReadOnlyList<string> Files) Run(string reportDir, string? outDir, bool force, ReportPackOptions? options = null)
    {
        if (!Directory.Exists(reportDir))
            throw new InputException("report folder not found; pass the folder a study run wrote", reportDir);
        var data = ReportDataJson.Load(Path.Combine(reportDir, ReportDataJson.FileName));
        var content = ReportContent.From(data);
        bool inPlace = outDir is null || Path.GetFullPath(outDir) == Path.GetFullPath(reportDir);
        var target = inPlace ? reportDir : outDir!;
        // In place, every file the redraw does not write is carried over (whoever wrote it); elsewhere the
        // target is an ordinary output folder and the report folder is an input.
        var folder = inPlace
            ? OutputFolder.Begin(target, force: true, keepForeignFiles: true)
            : OutputFolder.Begin(target, force, [Path.Combine(reportDir, ReportDataJson.FileName)]);
        try
        {
            if (inPlace) CarryOverKept(folder);
            else CopyKept(reportDir, folder.Staging);
            var files = new ReportPackWriter(options).WriteInto(folder.Staging, content);
            folder.Commit();
            return (target, files);
        }
        catch
        {
            folder.Abandon();
            throw;
        }
    }

    // Carries over every file outside the redrawn outputs; a file inside them that sizetest did not write is refused.
    private static void CarryOverKept(OutputFolder folder)
    {
        var options = new EnumerationOptions { RecurseSubdirectories = true, AttributesToSkip = 0 };
        bool hasMarker = OutputFolder.ReadMarker(folder.Target) is not null;
        foreach (var full in Directory.EnumerateFiles(folder.Target, "*", options))
        {
            var rel = Path.GetRelativePath(folder.Target, full).Replace('\\', '/');
            if (rel == OutputFolder.MarkerFileName) continue;
            var top = rel.Split('/')[0];
            if (!ReportOutputs.Contains(top)) { folder.CarryOver(rel); continue; }
            if (!hasMarker) { folder.Adopt(rel); continue; } // a folder from before markers: its report files are ours
            if (!folder.PreviouslyOwned.Contains(rel))
                throw new InputException($"report folder holds '{rel}', which sizetest did not write and a redraw would replace; move it away and rerun", folder.Target);
        }
    }

    private static void CopyKept(string from, string to)
    {
        foreach (var entry in Directory.EnumerateFileSystemEntries(from))
        {
            var name = Path.GetFileName(entry);
            if (ReportOutputs.Contains(name) || name == OutputFolder.MarkerFileName) continue;
            if (Directory.Exists(entry)) CopyTree(entry, Path.Combine(to, name));
            else File.Copy(entry, Path.Combine(to, name));
        }
    }

    private static void CopyTree(string from, string to)
    {
        Directory.CreateDirectory(to);
        foreach (var f in Directory.EnumerateFiles(from)) File.Copy(f, Path.Combine(to, Path.GetFileName(f)));
        foreach (var d in Directory.EnumerateDirectories(from)) CopyTree(d, Path.Combine(to, Path.GetFileName(d)));
    }
}

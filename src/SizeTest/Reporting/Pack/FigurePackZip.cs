using System.IO.Compression;

namespace SizeTest.Reporting.Pack;

/// <summary>
/// Builds <c>figures.zip</c>: the figure pack (every figure as PNG, SVG and PDF, every table as CSV and LaTeX) in one
/// archive to upload with a manuscript. Entries keep their folder (<c>figures/NAME.pdf</c>, <c>tables/NAME.tex</c>),
/// appear in ordinal order and carry a fixed time stamp, so the same files give the same archive bytes.
/// </summary>
public static class FigurePackZip
{
    /// <summary>Name of the archive in the report folder.</summary>
    public const string FileName = "figures.zip";

    // The earliest time a zip entry can hold (MS-DOS date), used so the archive does not depend on the clock.
    private static readonly DateTimeOffset FixedStamp = new(1980, 1, 1, 0, 0, 0, TimeSpan.Zero);

    /// <summary>Zips the files <paramref name="relativePaths"/> (relative to <paramref name="folder"/>) into a byte array.</summary>
    public static byte[] Build(string folder, IEnumerable<string> relativePaths)
    {
        ArgumentNullException.ThrowIfNull(relativePaths);
        using var ms = new MemoryStream();
        using (var zip = new ZipArchive(ms, ZipArchiveMode.Create, leaveOpen: true))
            foreach (var rel in relativePaths)
            {
                var entry = zip.CreateEntry(rel, CompressionLevel.Optimal);
                entry.LastWriteTime = FixedStamp;
                using var output = entry.Open();
                using var input = File.OpenRead(Path.Combine(folder, rel));
                input.CopyTo(output);
            }
        return ms.ToArray();
    }
}

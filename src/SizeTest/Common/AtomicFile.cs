using System.Text;

namespace SizeTest.Common;

/// <summary>
/// Writes files so that a reader never sees a half-written one: the content goes to a
/// temporary file beside the target, is flushed, and is then renamed over the target.
/// </summary>
public static class AtomicFile
{
    /// <summary>Writes <paramref name="text"/> (UTF-8, no BOM) atomically to <paramref name="path"/>.</summary>
    public static void WriteAllText(string path, string text) =>
        Write(path, stream =>
        {
            var bytes = new UTF8Encoding(false).GetBytes(text);
            stream.Write(bytes, 0, bytes.Length);
        });

    /// <summary>Writes <paramref name="bytes"/> atomically to <paramref name="path"/>.</summary>
    public static void WriteAllBytes(string path, ReadOnlySpan<byte> bytes)
    {
        var copy = bytes.ToArray();
        Write(path, stream => stream.Write(copy, 0, copy.Length));
    }

    /// <summary>
    /// Calls <paramref name="writeContent"/> with a stream on a temporary file beside
    /// <paramref name="path"/>, then renames it over the target. On any exception the
    /// temporary file is deleted and the target is left as it was.
    /// </summary>
    public static void Write(string path, Action<Stream> writeContent)
    {
        var full = Path.GetFullPath(path);
        var dir = Path.GetDirectoryName(full)!;
        Directory.CreateDirectory(dir);
        var tmp = Path.Combine(dir, $".{Path.GetFileName(full)}.tmp-{Environment.ProcessId}-{Guid.NewGuid():N}");
        try
        {
            using (var fs = new FileStream(tmp, FileMode.CreateNew, FileAccess.Write, FileShare.None))
            {
                writeContent(fs);
                fs.Flush(true);
            }
            File.Move(tmp, full, overwrite: true);
        }
        catch
        {
            try { if (File.Exists(tmp)) File.Delete(tmp); } catch (IOException) { }
            throw;
        }
    }
}

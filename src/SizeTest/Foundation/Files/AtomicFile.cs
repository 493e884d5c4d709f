using System.Text;
using SizeTest.Foundation.Errors;

namespace SizeTest.Foundation.Files;

/// <summary>
/// Writes files so that a reader never sees a half-written one: the content goes to a
/// temporary file beside the target (<c>.NAME.tmp-PID-GUID</c>, registered with <see cref="StagingRegistry"/> so an
/// interrupt removes it; stale ones of dead processes are removed first), is flushed, and is then renamed over
/// the target. Path and permission problems are <see cref="InputException"/>s naming the file.
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
        StagingRegistry.ThrowIfTerminating();
        string full;
        try { full = Path.GetFullPath(path); }
        catch (ArgumentException e) { throw new InputException($"'{path}' is not a valid output path ({e.Message.TrimEnd('.')})", inner: e); }
        if (Directory.Exists(full)) throw new InputException($"output path '{path}' is a folder; name a file");
        var dir = Path.GetDirectoryName(full) ?? throw new InputException($"output path '{path}' has no folder");
        try { Directory.CreateDirectory(dir); }
        catch (IOException e) { throw new InputException($"cannot create the folder of '{path}' ({e.Message.TrimEnd('.')})", inner: e); }
        catch (UnauthorizedAccessException e) { throw new InputException($"cannot create the folder of '{path}' ({e.Message.TrimEnd('.')})", inner: e); }
        StagingRegistry.RemoveStale(dir, Path.GetFileName(full));
        var tmp = Path.Combine(dir, $".{Path.GetFileName(full)}.tmp-{Environment.ProcessId}-{Guid.NewGuid():N}");
        StagingRegistry.Register(tmp);
        try
        {
            using (var fs = new FileStream(tmp, FileMode.CreateNew, FileAccess.Write, FileShare.None))
            {
                writeContent(fs);
                fs.Flush(true);
            }
            StagingRegistry.ThrowIfTerminating();
            File.Move(tmp, full, overwrite: true);
        }
        catch (Exception e) when (e is UnauthorizedAccessException || (e is IOException && e is not FileNotFoundException && e is not DirectoryNotFoundException))
        {
            TryDelete(tmp);
            throw new InputException($"cannot write '{path}' ({e.Message.TrimEnd('.')})", inner: e);
        }
        catch
        {
            TryDelete(tmp);
            throw;
        }
        finally
        {
            StagingRegistry.Unregister(tmp);
        }
    }

    private static void TryDelete(string tmp)
    {
        try { if (File.Exists(tmp)) File.Delete(tmp); } catch (Exception e) when (e is IOException or UnauthorizedAccessException) { }
    }
}

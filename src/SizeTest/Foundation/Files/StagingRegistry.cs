using System.Collections.Concurrent;

namespace SizeTest.Foundation.Files;

/// <summary>
/// The staging folders and temporary files this process is writing, so that an interrupt
/// (SIGINT, SIGTERM) or a normal process exit can remove them; and the clean-up of stale ones
/// left by processes that died (their PID, part of every staging name, is no longer alive).
/// </summary>
/// <remarks>
/// Staging names have the form <c>.NAME.tmp-PID-GUID</c> (folders and files) and
/// <c>.NAME.old-PID-GUID</c> (a replaced folder about to be deleted); see <see cref="OutputFolder"/>
/// and <see cref="AtomicFile"/>.
/// </remarks>
public static class StagingRegistry
{
    private static readonly ConcurrentDictionary<string, byte> Live = new(StringComparer.Ordinal);
    private static volatile bool _terminating;

    /// <summary>True once an interrupt started removing staging folders; writers must stop.</summary>
    public static bool Terminating => _terminating;

    /// <summary>Paths registered now (for tests and diagnostics).</summary>
    public static IReadOnlyCollection<string> Paths => Live.Keys.ToArray();

    /// <summary>Registers a staging folder or temporary file of this process.</summary>
    public static void Register(string path)
    {
        ThrowIfTerminating();
        Live[path] = 0;
    }

    /// <summary>Forgets a path (committed or already removed).</summary>
    public static void Unregister(string path) => Live.TryRemove(path, out _);

    /// <summary>Throws <see cref="OperationCanceledException"/> when the process is being interrupted.</summary>
    public static void ThrowIfTerminating()
    {
        if (_terminating) throw new OperationCanceledException("sizetest was interrupted; its staging files are being removed");
    }

    /// <summary>
    /// Marks the process as terminating and deletes every registered staging folder and file.
    /// Safe to call more than once and from a signal handler thread. The paths stay registered: a writer
    /// that passed <see cref="ThrowIfTerminating"/> just before the flag was set may re-create its folder,
    /// and the next call (the process-exit handler) deletes it again.
    /// </summary>
    public static void RemoveAll()
    {
        _terminating = true;
        foreach (var path in Live.Keys.ToArray())
            TryDelete(path);
    }

    /// <summary>
    /// Removes staging entries in <paramref name="folder"/> whose name starts with
    /// <c>.</c><paramref name="baseName"/><c>.tmp-</c> or <c>.old-</c>, followed by a PID that is no longer
    /// alive. Entries of live processes (including this one) are left alone. Returns the paths removed.
    /// </summary>
    public static IReadOnlyList<string> RemoveStale(string folder, string baseName)
    {
        var removed = new List<string>();
        if (!Directory.Exists(folder)) return removed;
        IEnumerable<string> entries;
        try { entries = Directory.EnumerateFileSystemEntries(folder, "." + baseName + ".*").ToArray(); }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException) { return removed; }
        foreach (var entry in entries)
        {
            var name = Path.GetFileName(entry);
            var rest = name.AsSpan(baseName.Length + 1);
            if (!(rest.StartsWith(".tmp-") || rest.StartsWith(".old-"))) continue;
            rest = rest[5..];
            int dash = rest.IndexOf('-');
            if (dash <= 0 || !int.TryParse(rest[..dash], System.Globalization.NumberStyles.None, System.Globalization.CultureInfo.InvariantCulture, out int pid)) continue;
            var guid = rest[(dash + 1)..];
            if (guid.Length != 32 || !IsHex(guid)) continue;
            if (ProcessAlive(pid)) continue;
            if (TryDelete(entry)) removed.Add(entry);
        }
        return removed;
    }

    /// <summary>Whether process <paramref name="pid"/> exists (on Linux: <c>/proc/PID</c> exists).</summary>
    public static bool ProcessAlive(int pid)
    {
        if (pid == Environment.ProcessId) return true;
        if (OperatingSystem.IsLinux()) return Directory.Exists($"/proc/{pid}");
        try
        {
            using var p = System.Diagnostics.Process.GetProcessById(pid);
            return !p.HasExited;
        }
        catch (ArgumentException) { return false; }
        catch (InvalidOperationException) { return false; }
    }

    private static bool IsHex(ReadOnlySpan<char> s)
    {
        foreach (var c in s)
            if (!char.IsAsciiHexDigit(c)) return false;
        return true;
    }

    private static bool TryDelete(string path)
    {
        try
        {
            if (Directory.Exists(path)) Directory.Delete(path, recursive: true);
            else if (File.Exists(path)) File.Delete(path);
            return true;
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            return false;
        }
    }
}

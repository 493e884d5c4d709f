using SizeTest.Foundation.Errors;

namespace SizeTest.Foundation.Files;

/// <summary>
/// Prepares an output folder the way every verb that writes a folder of results must.
/// <list type="bullet">
/// <item>Results are built in a hidden staging folder beside the target (<c>.NAME.tmp-PID-GUID</c>) and
/// swapped in only when complete; an interrupt or failure removes the staging folder and leaves the
/// target as it was.</item>
/// <item>Every committed folder holds a marker file, <see cref="MarkerFileName"/>, listing the files
/// SizeTest wrote there. An existing non-empty folder is refused without <c>force</c>; with it, only a
/// folder that has the marker, whose every file the marker lists and which holds no input of the run
/// is replaced, and only the files SizeTest wrote there are deleted.</item>
/// <item>A lock file beside the target (<c>.NAME.lock</c>, an exclusive <c>flock</c> held from
/// <see cref="Begin"/> to <see cref="Commit"/>/<see cref="Abandon"/>) stops two runs interleaving on one
/// folder; <see cref="Commit"/> re-checks the target and fails cleanly if another run changed it
/// since <see cref="Begin"/>.</item>
/// <item>Stale staging folders of processes that are no longer alive are removed by the next run.</item>
/// </list>
/// All refusals are <see cref="InputException"/>s (exit 2) naming the folder.
/// </summary>
public sealed class OutputFolder : IDisposable
{
    /// <summary>Name of the marker file SizeTest writes in every output folder it commits.</summary>
    public const string MarkerFileName = ".sizetest-output";

    private const string MarkerHeader = "# sizetest output folder: the files below were written by sizetest; 'sizetest --force' replaces only these";

    private readonly string _display;
    private readonly bool _force;
    private readonly bool _keepForeign;
    private readonly List<string> _inputs = new();
    private readonly HashSet<string> _carried = new(StringComparer.Ordinal);
    private readonly string? _snapshot;
    private readonly HashSet<string> _previouslyOwned;
    private FileStream? _lock;
    private readonly string _lockPath;
    private bool _done;

    private OutputFolder(string display, string target, string staging, bool force, bool keepForeign,
        string? snapshot, HashSet<string> owned, FileStream lockStream, string lockPath, IEnumerable<string> inputs)
    {
        _display = display;
        Target = target;
        Staging = staging;
        _force = force;
        _keepForeign = keepForeign;
        _snapshot = snapshot;
        _previouslyOwned = owned;
        _lock = lockStream;
        _lockPath = lockPath;
        _inputs.AddRange(inputs);
    }

    /// <summary>The folder the user asked for (full path).</summary>
    public string Target { get; }

    /// <summary>The temporary folder to write into; becomes <see cref="Target"/> on <see cref="Commit"/>.</summary>
    public string Staging { get; }

    /// <summary>Files (relative, '/'-separated) of the existing target that the marker says SizeTest wrote.</summary>
    public IReadOnlyCollection<string> PreviouslyOwned => _previouslyOwned;

    /// <summary>Stale staging entries of dead processes that <see cref="Begin"/> removed.</summary>
    public IReadOnlyList<string> RemovedStale { get; private init; } = [];

    /// <summary>Starts writing into <paramref name="target"/>; see the class remarks for what is refused.</summary>
    /// <param name="target">The folder asked for (e.g. <c>--out</c>).</param>
    /// <param name="force">Whether an existing SizeTest folder may be replaced.</param>
    /// <param name="inputs">Files the run reads (catalogue, study file, filter files…); none may lie inside the target.</param>
    /// <param name="keepForeignFiles">Redraw in place: files SizeTest did not write are allowed and must be
    /// carried over with <see cref="CarryOver"/> (checked at <see cref="Commit"/>).</param>
    public static OutputFolder Begin(string target, bool force, IEnumerable<string>? inputs = null, bool keepForeignFiles = false)
    {
        if (string.IsNullOrWhiteSpace(target))
            throw SettingProblem.Input("the output folder is empty ({out} ''); name a folder to write the results to");
        string full;
        try { full = Path.TrimEndingDirectorySeparator(Path.GetFullPath(target)); }
        catch (Exception e) when (e is ArgumentException or NotSupportedException or PathTooLongException)
        {
            throw new InputException($"output folder '{target}' is not a valid path ({e.Message.TrimEnd('.')})", inner: e);
        }
        var parent = Path.GetDirectoryName(full);
        if (parent is null || Path.GetFileName(full).Length == 0)
            throw new InputException($"output folder '{target}' is the root of the file system; choose a folder of its own");
        if (File.Exists(full))
            throw SettingProblem.Input($"output path '{target}' is a file, not a folder; choose another {{out}}");
        for (var up = parent; up is not null; up = Path.GetDirectoryName(up))
        {
            if (File.Exists(up))
                throw SettingProblem.Input($"output folder '{target}' lies under '{up}', which is a file; choose another {{out}}");
            if (Directory.Exists(up)) break;
        }
        var inputList = (inputs ?? []).Where(p => !string.IsNullOrEmpty(p)).Select(p => Path.GetFullPath(p)).ToList();
        CheckNotInside(target, full, inputList);

        try { Directory.CreateDirectory(parent); }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw SettingProblem.Input($"cannot create the output folder's parent '{parent}' ({e.Message.TrimEnd('.')}); choose another {{out}}", inner: e);
        }
        var name = Path.GetFileName(full);
        var lockPath = Path.Combine(parent, $".{name}.lock");
        var lockStream = AcquireLock(target, lockPath);
        try
        {
            var removed = StagingRegistry.RemoveStale(parent, name);
            var (snapshot, owned) = Inspect(target, full, force, keepForeignFiles, inputList);
            var staging = Path.Combine(parent, $".{name}.tmp-{Environment.ProcessId}-{Guid.NewGuid():N}");
            StagingRegistry.Register(staging);
            try { Directory.CreateDirectory(staging); }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException)
            {
                StagingRegistry.Unregister(staging);
                throw SettingProblem.Input($"cannot write in '{parent}' ({e.Message.TrimEnd('.')}); choose another {{out}}", inner: e);
            }
            return new OutputFolder(target, full, staging, force, keepForeignFiles, snapshot, owned, lockStream, lockPath, inputList) { RemovedStale = removed };
        }
        catch
        {
            ReleaseLock(lockStream, lockPath);
            throw;
        }
    }

    /// <summary>Path of a file inside the staging folder (subfolders are created).</summary>
    public string PathOf(string relative)
    {
        StagingRegistry.ThrowIfTerminating();
        var p = Path.Combine(Staging, relative);
        Directory.CreateDirectory(Path.GetDirectoryName(p)!);
        return p;
    }

    /// <summary>
    /// Registers a further input of the run (a file read after <see cref="Begin"/>); throws
    /// <see cref="InputException"/> when it lies inside the target folder.
    /// </summary>
    public void AddInput(string path)
    {
        var full = Path.GetFullPath(path);
        CheckNotInside(_display, Target, [full]);
        _inputs.Add(full);
    }

    /// <summary>
    /// Copies <paramref name="relative"/> from the existing target into the staging folder, keeping whether
    /// SizeTest wrote it (used by an in-place redraw, which keeps every file it does not redraw).
    /// </summary>
    public void CarryOver(string relative)
    {
        var rel = relative.Replace('\\', '/');
        var dest = PathOf(rel);
        File.Copy(Path.Combine(Target, rel), dest, overwrite: false);
        _carried.Add(rel);
    }

    /// <summary>
    /// Declares an existing file of the target as written by SizeTest (an in-place redraw of a folder written
    /// before markers existed, whose report files follow SizeTest's names), so it may be replaced.
    /// </summary>
    public void Adopt(string relative) => _previouslyOwned.Add(relative.Replace('\\', '/'));

    /// <summary>
    /// Writes the marker, re-checks the target (refusing, with the staging folder removed, when another run
    /// filled or changed it since <see cref="Begin"/>), moves the target aside, swaps the staging folder in and
    /// deletes only the old files SizeTest wrote. Returns notes (e.g. files kept aside); usually empty.
    /// </summary>
    public IReadOnlyList<string> Commit()
    {
        if (_done) throw new InvalidOperationException("output folder already committed or abandoned");
        var notes = new List<string>();
        try
        {
            StagingRegistry.ThrowIfTerminating();
            // Re-check under the lock: the target must be as Begin saw it.
            string? now;
            try { (now, _) = Inspect(_display, Target, _force, _keepForeign, _inputs); }
            catch (InputException) when (_snapshot is null) { now = "(filled)"; }
            if (!string.Equals(now, _snapshot, StringComparison.Ordinal))
                throw SettingProblem.Input($"output folder '{_display}' was written by another run while this one was working; nothing was replaced and this run's results were discarded; rerun with another {{out}}");
            if (_keepForeign)
                foreach (var f in Files(Target))
                    if (!_previouslyOwned.Contains(f) && !_carried.Contains(f))
                        throw new InputException($"output folder '{_display}' holds '{f}', which sizetest did not write and would replace; move it away and rerun");
            WriteMarker();
            string? old = null;
            if (Directory.Exists(Target))
            {
                old = Path.Combine(Path.GetDirectoryName(Target)!, $".{Path.GetFileName(Target)}.old-{Environment.ProcessId}-{Guid.NewGuid():N}");
                StagingRegistry.Register(old);
                Directory.Move(Target, old);
            }
            try
            {
                Directory.Move(Staging, Target);
            }
            catch
            {
                if (old is not null) { Directory.Move(old, Target); StagingRegistry.Unregister(old); }
                throw;
            }
            StagingRegistry.Unregister(Staging);
            if (old is not null)
            {
                StagingRegistry.Unregister(old);
                _done = true;   // the new results are in place: a failure below must not discard them
                try
                {
                    var kept = DeleteOwned(old);
                    if (kept is not null) notes.Add($"files that appeared in '{_display}' during the run were kept in '{kept}'");
                }
                catch (Exception e) when (e is IOException or UnauthorizedAccessException)
                {
                    notes.Add($"the previous contents of '{_display}' could not all be deleted ({e.Message.TrimEnd('.')}); they are kept in '{KeepAside(old)}'");
                }
            }
            _done = true;
            return notes;
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            Abandon();
            throw SettingProblem.Input($"cannot write the output folder '{_display}' ({e.Message.TrimEnd('.')}); choose another {{out}}", inner: e);
        }
        catch
        {
            Abandon();
            throw;
        }
        finally
        {
            ReleaseLock(_lock, _lockPath);
            _lock = null;
        }
    }

    /// <summary>Discards the staging folder and releases the lock; the target stays as it was.</summary>
    public void Abandon()
    {
        if (!_done)
        {
            try { if (Directory.Exists(Staging)) Directory.Delete(Staging, recursive: true); }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException) { }
            StagingRegistry.Unregister(Staging);
            _done = true;
        }
        ReleaseLock(_lock, _lockPath);
        _lock = null;
    }

    /// <summary>Same as <see cref="Abandon"/> when not committed.</summary>
    public void Dispose() => Abandon();

    /// <summary>Reads the list of files a marker says SizeTest wrote (relative, '/'-separated); null without a marker.</summary>
    public static HashSet<string>? ReadMarker(string folder)
    {
        var path = Path.Combine(folder, MarkerFileName);
        if (!File.Exists(path)) return null;
        var info = new FileInfo(path);
        if (info.Length > 16 << 20) return null; // not one of ours
        var set = new HashSet<string>(StringComparer.Ordinal);
        foreach (var line in File.ReadLines(path))
        {
            var t = line.Trim();
            if (t.Length == 0 || t[0] == '#') continue;
            set.Add(t);
        }
        return set;
    }

    private void WriteMarker()
    {
        var files = Files(Staging).Where(f => !_carried.Contains(f) || _previouslyOwned.Contains(f)).Order(StringComparer.Ordinal);
        var text = MarkerHeader + "\n" + string.Concat(files.Select(f => f + "\n"));
        File.WriteAllText(Path.Combine(Staging, MarkerFileName), text);
    }

    // What the target looks like now: null when absent or empty, else the marker's text (or a tag when it
    // has none). Throws for what must be refused.
    private static (string? Snapshot, HashSet<string> Owned) Inspect(string display, string full, bool force, bool keepForeign, IReadOnlyList<string> inputs)
    {
        var owned = new HashSet<string>(StringComparer.Ordinal);
        if (!Directory.Exists(full)) return (null, owned);
        bool any;
        try { any = Directory.EnumerateFileSystemEntries(full).Any(); }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw SettingProblem.Input($"cannot read the output folder '{display}' ({e.Message.TrimEnd('.')}); choose another {{out}}", inner: e);
        }
        if (!any) return (null, owned);
        CheckNotInside(display, full, inputs);
        if (!force)
            throw SettingProblem.Input($"output folder '{display}' already exists and is not empty; pass {{force}} to replace it or choose another {{out}}");
        var marker = ReadMarker(full);
        if (marker is null && !keepForeign)
            throw SettingProblem.Input($"output folder '{display}' was not written by sizetest (it has no {MarkerFileName} marker); {{force}} replaces only folders sizetest wrote; choose another {{out}}");
        owned = marker ?? owned;
        if (!keepForeign)
            foreach (var f in Files(full))
                if (!owned.Contains(f))
                    throw SettingProblem.Input($"output folder '{display}' holds '{f}', which sizetest did not write; {{force}} replaces only sizetest's own files; move it away or choose another {{out}}");
        CheckReplaceable(display, full, owned);
        var text = File.Exists(Path.Combine(full, MarkerFileName)) ? File.ReadAllText(Path.Combine(full, MarkerFileName)) : "(no marker)";
        return (text + "\n" + string.Join("\n", Files(full)), owned);
    }

    // Replacing moves the folder aside and deletes the files SizeTest wrote there: refuse now, before the run,
    // what the file system would refuse then (an immutable folder or file, a folder without write permission).
    private static void CheckReplaceable(string display, string full, IEnumerable<string> owned)
    {
        if (FileSystemLocks.IsImmutable(full))
            throw SettingProblem.Input($"output folder '{display}' is marked immutable or append-only (chattr +i/+a) and cannot be replaced; clear the flag or choose another {{out}}");
        var folders = new HashSet<string>(StringComparer.Ordinal) { full };
        foreach (var rel in owned.Append(MarkerFileName))
        {
            var path = Path.Combine(full, rel);
            if (!File.Exists(path) && !Directory.Exists(path)) continue;
            if (FileSystemLocks.IsImmutable(path))
                throw SettingProblem.Input($"output folder '{display}' holds '{rel}', which is marked immutable or append-only (chattr +i/+a), so {{force}} cannot replace it; clear the flag or choose another {{out}}");
            folders.Add(Path.GetDirectoryName(path)!);
        }
        foreach (var folder in folders.Where(Directory.Exists))
            if (!FileSystemLocks.CanChangeFolder(folder))
                throw SettingProblem.Input($"output folder '{display}' cannot be replaced: sizetest may not delete files in '{folder}' (no write permission, or immutable); choose another {{out}}");
    }

    private static void CheckNotInside(string display, string full, IEnumerable<string> inputs)
    {
        var prefix = full + Path.DirectorySeparatorChar;
        foreach (var input in inputs)
            if (input == full || input.StartsWith(prefix, StringComparison.Ordinal))
                throw SettingProblem.Input($"output folder '{display}' holds '{Path.GetRelativePath(full, input)}', an input of this run; sizetest never replaces its inputs; choose another {{out}}");
    }

    // Every file below folder (relative, '/'-separated), except the marker.
    private static List<string> Files(string folder) =>
        Directory.EnumerateFiles(folder, "*", new EnumerationOptions { RecurseSubdirectories = true, AttributesToSkip = 0, IgnoreInaccessible = false })
            .Select(f => Path.GetRelativePath(folder, f).Replace('\\', '/'))
            .Where(f => f != MarkerFileName)
            .ToList();

    // Deletes the files of the old folder that SizeTest wrote (and the carried-over copies), then empty folders.
    // Returns the folder's new name when something else was left (it is kept, never deleted).
    private string? DeleteOwned(string old)
    {
        foreach (var f in Files(old))
            if (_previouslyOwned.Contains(f) || _carried.Contains(f))
                File.Delete(Path.Combine(old, f));
        var marker = Path.Combine(old, MarkerFileName);
        if (File.Exists(marker)) File.Delete(marker);
        foreach (var d in Directory.EnumerateDirectories(old, "*", SearchOption.AllDirectories).OrderByDescending(d => d.Length))
            if (!Directory.EnumerateFileSystemEntries(d).Any()) Directory.Delete(d);
        if (!Directory.EnumerateFileSystemEntries(old).Any())
        {
            Directory.Delete(old);
            return null;
        }
        return KeepAside(old);
    }

    // Gives a left-over old folder a visible name beside the target; keeps the hidden name if that fails.
    private string KeepAside(string old)
    {
        var keep = Target + $".kept-{DateTime.UtcNow:yyyyMMddTHHmmss}";
        try { Directory.Move(old, keep); return keep; }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException) { return old; }
    }

    private static FileStream AcquireLock(string display, string lockPath)
    {
        try
        {
            var fs = new FileStream(lockPath, FileMode.OpenOrCreate, FileAccess.ReadWrite, FileShare.None);
            fs.SetLength(0);
            var pid = System.Text.Encoding.ASCII.GetBytes(Environment.ProcessId.ToString(System.Globalization.CultureInfo.InvariantCulture) + "\n");
            fs.Write(pid);
            fs.Flush();
            StagingRegistry.Register(lockPath);   // an interrupt removes it with the staging folder
            return fs;
        }
        catch (UnauthorizedAccessException e)
        {
            throw SettingProblem.Input($"cannot write beside the output folder '{display}' ({e.Message.TrimEnd('.')}); choose another {{out}}", inner: e);
        }
        catch (IOException e) when (File.Exists(lockPath))
        {
            throw SettingProblem.Input($"output folder '{display}' is being written by another sizetest run (lock file '{lockPath}'); wait for it to finish or choose another {{out}}", inner: e);
        }
        catch (IOException e)
        {
            throw SettingProblem.Input($"cannot write beside the output folder '{display}' ({e.Message.TrimEnd('.')}); choose another {{out}}", inner: e);
        }
    }

    private static void ReleaseLock(FileStream? fs, string lockPath)
    {
        if (fs is null) return;
        try { File.Delete(lockPath); } catch (Exception e) when (e is IOException or UnauthorizedAccessException) { }
        StagingRegistry.Unregister(lockPath);
        fs.Dispose();
    }
}

namespace SizeTest.Common;

/// <summary>
/// Prepares an output folder the way every verb that writes a folder of results must:
/// results are built in a temporary sibling folder and swapped in only when complete, and an
/// existing non-empty folder is never touched without <c>force</c>.
/// </summary>
public sealed class OutputFolder
{
    private OutputFolder(string target, string staging)
    {
        Target = target;
        Staging = staging;
    }

    /// <summary>The folder the user asked for.</summary>
    public string Target { get; }

    /// <summary>The temporary folder to write into; becomes <see cref="Target"/> on <see cref="Commit"/>.</summary>
    public string Staging { get; }

    /// <summary>
    /// Starts writing into <paramref name="target"/>. Throws <see cref="InputException"/> when the
    /// folder exists, is not empty and <paramref name="force"/> is false.
    /// </summary>
    public static OutputFolder Begin(string target, bool force)
    {
        var full = Path.GetFullPath(target);
        if (Directory.Exists(full) && Directory.EnumerateFileSystemEntries(full).Any() && !force)
            throw new InputException($"output folder '{target}' already exists and is not empty; pass --force to replace it or choose another --out");
        if (File.Exists(full))
            throw new InputException($"output path '{target}' is a file, not a folder; choose another --out");
        var parent = Path.GetDirectoryName(full)!;
        Directory.CreateDirectory(parent);
        var staging = Path.Combine(parent, $".{Path.GetFileName(full)}.tmp-{Environment.ProcessId}-{Guid.NewGuid():N}");
        Directory.CreateDirectory(staging);
        return new OutputFolder(full, staging);
    }

    /// <summary>Path of a file inside the staging folder (subfolders are created).</summary>
    public string PathOf(string relative)
    {
        var p = Path.Combine(Staging, relative);
        Directory.CreateDirectory(Path.GetDirectoryName(p)!);
        return p;
    }

    /// <summary>Replaces the target by the finished staging folder.</summary>
    public void Commit()
    {
        string? old = null;
        if (Directory.Exists(Target))
        {
            old = Target + $".old-{Environment.ProcessId}-{Guid.NewGuid():N}";
            Directory.Move(Target, old);
        }
        Directory.Move(Staging, Target);
        if (old is not null) Directory.Delete(old, recursive: true);
    }

    /// <summary>Discards the staging folder; the target stays as it was.</summary>
    public void Abandon()
    {
        try { if (Directory.Exists(Staging)) Directory.Delete(Staging, recursive: true); } catch (IOException) { }
    }
}

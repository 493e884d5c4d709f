namespace SizeTest.Foundation.Files;

/// <summary>Path comparisons for the rule that no output replaces an input.</summary>
public static class FilePaths
{
    /// <summary>
    /// Whether <paramref name="a"/> and <paramref name="b"/> name the same file: equal full paths, or, when both exist, the
    /// same final target after symbolic links are followed. (Hard links to one inode are not detected.)
    /// </summary>
    public static bool SameFile(string a, string b)
    {
        ArgumentNullException.ThrowIfNull(a);
        ArgumentNullException.ThrowIfNull(b);
        string fa = Path.GetFullPath(a), fb = Path.GetFullPath(b);
        if (string.Equals(fa, fb, StringComparison.Ordinal)) return true;
        if (!File.Exists(fa) || !File.Exists(fb)) return false;
        return string.Equals(Resolve(fa), Resolve(fb), StringComparison.Ordinal);
    }

    private static string Resolve(string full)
    {
        try
        {
            return new FileInfo(full).ResolveLinkTarget(returnFinalTarget: true)?.FullName ?? full;
        }
        catch (IOException)
        {
            return full; // a link loop or an unreadable link: compare the path itself
        }
    }
}

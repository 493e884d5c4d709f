using System.Globalization;
using System.Text;
using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Files;

namespace SizeTest.Catalogues;

/// <summary>
/// Every row the loader rejected, one entry per row (the first fault found, in role order),
/// in file order. Written as CSV with columns <c>row,column,value,reason,detail</c>.
/// </summary>
public sealed class RejectLog
{
    private readonly List<RejectEntry> _entries = new();

    /// <summary>The source file.</summary>
    public string SourceName { get; }

    /// <summary>Creates an empty log for <paramref name="sourceName"/>.</summary>
    public RejectLog(string sourceName) => SourceName = sourceName;

    /// <summary>The entries in file order.</summary>
    public IReadOnlyList<RejectEntry> Entries => _entries;

    /// <summary>Number of rejected rows.</summary>
    public int Count => _entries.Count;

    /// <summary>Adds an entry.</summary>
    public void Add(RejectEntry entry) => _entries.Add(entry);

    /// <summary>Counts per reason, most frequent first.</summary>
    public IReadOnlyList<(RejectReason Reason, int Count)> CountsByReason() =>
        _entries.GroupBy(e => e.Reason).Select(g => (g.Key, g.Count())).OrderByDescending(x => x.Item2).ThenBy(x => x.Key).ToArray();

    /// <summary>The CSV text of the log (header <c>row,column,value,reason,detail</c>, RFC 4180 quoting).</summary>
    public string ToCsv()
    {
        var sb = new StringBuilder("row,column,value,reason,detail\n");
        foreach (var e in _entries)
            sb.Append(e.Row.ToString(CultureInfo.InvariantCulture)).Append(',')
              .Append(Quote(e.Column)).Append(',').Append(Quote(e.Value)).Append(',')
              .Append(Quote(e.Reason.Code())).Append(',').Append(Quote(e.Detail)).Append('\n');
        return sb.ToString();
    }

    /// <summary>
    /// Writes the log atomically to <paramref name="path"/>. Refuses to replace an existing file
    /// unless <paramref name="force"/> (throws <see cref="InputException"/>).
    /// </summary>
    public void WriteCsv(string path, bool force = false)
    {
        if (File.Exists(path) && !force)
            throw SettingProblem.Input($"reject log '{path}' already exists; pass {{force}} to replace it or choose another path");
        AtomicFile.WriteAllText(path, ToCsv());
    }

    /// <summary>Quotes a CSV field when it holds a comma, quote, line break or leading/trailing space.</summary>
    public static string Quote(string s)
    {
        if (s.Length == 0) return s;
        bool needs = s.AsSpan().IndexOfAny(",\"\r\n") >= 0 || s[0] == ' ' || s[^1] == ' ' || s[0] == '#';
        return needs ? "\"" + s.Replace("\"", "\"\"") + "\"" : s;
    }
}

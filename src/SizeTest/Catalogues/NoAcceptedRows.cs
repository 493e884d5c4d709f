using System.Globalization;
using SizeTest.Foundation.Errors;

namespace SizeTest.Catalogues;

/// <summary>
/// The error for a catalogue of which no row was accepted: it names the file, the rows read, the commonest reject reason
/// with its count and a first example (row, column, value, detail), so the user sees at once what to fix — a decimal comma,
/// a wrong unit, a sentinel — instead of a fit that has "no objects".
/// </summary>
public static class NoAcceptedRows
{
    /// <summary>Throws <see cref="InputException"/> (exit 2) when <paramref name="load"/> accepted no row; returns otherwise.</summary>
    public static void ThrowIfEmpty(CatalogueLoad load, string path)
    {
        ArgumentNullException.ThrowIfNull(load);
        if (load.Accepted > 0) return;
        var inv = CultureInfo.InvariantCulture;
        if (load.RowsRead == 0) throw new InputException("the catalogue has no data rows", path);
        var top = load.RejectLog.Entries.GroupBy(e => e.Reason).OrderByDescending(g => g.Count()).ThenBy(g => g.Key).First();
        var first = top.First();
        string example = string.Create(inv, $"e.g. row {first.Row}, column '{first.Column}', value '{first.Value}': {first.Detail}");
        throw new InputException(
            string.Create(inv, $"no row was accepted: {load.RowsRead} rows read, all rejected; most for '{top.Key.Code()}' ({top.Count()} rows; {example}). ") +
            "The inspect verb lists every rejected row and its reason (and writes them to a reject log)", path);
    }
}

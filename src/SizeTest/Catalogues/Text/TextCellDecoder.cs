using System.Globalization;
using System.Text;

namespace SizeTest.Catalogues.Text;

/// <summary>
/// The one decoder of text-table cells, shared by the delimited and the whitespace reader. A cell
/// is null when it is empty or one of the null tokens (<see cref="ReaderOptions.NullTokens"/>);
/// otherwise it is stored as text for a text request, or parsed as an invariant-culture number
/// (UTF-8 cells through the exact <see cref="FastDecimal"/> path, which falls back to the runtime
/// parser and agrees with it), and kept as invalid with its raw text when it is not a number.
/// </summary>
internal sealed class TextCellDecoder(IReadOnlyList<string> nullTokens)
{
    private readonly string[] _nullTokens = [.. nullTokens];
    private readonly byte[][] _nullTokensUtf8 = nullTokens.Select(t => Encoding.UTF8.GetBytes(t)).ToArray();

    /// <summary>Decodes one UTF-8 cell into <paramref name="buffer"/> at <paramref name="row"/>.</summary>
    public void Decode(ReadOnlySpan<byte> cell, ColumnBuffer buffer, bool asText, int row)
    {
        if (IsNull(cell)) buffer.SetNull(row);
        else if (asText) buffer.SetText(row, Encoding.UTF8.GetString(cell));
        else if (FastDecimal.TryParse(cell, out var v)) buffer.SetNumber(row, v);
        else
        {
            var s = Encoding.UTF8.GetString(cell);
            if (NumberText.TryParseNonFinite(s, out var nf)) buffer.SetNumber(row, nf); else buffer.SetInvalid(row, s);
        }
    }

    /// <summary>Decodes one UTF-16 cell into <paramref name="buffer"/> at <paramref name="row"/>.</summary>
    public void Decode(string cell, ColumnBuffer buffer, bool asText, int row)
    {
        if (IsNull(cell)) buffer.SetNull(row);
        else if (asText) buffer.SetText(row, cell);
        else if (NumberText.TryParse(cell, out var v)) buffer.SetNumber(row, v);
        else buffer.SetInvalid(row, cell);
    }

    private bool IsNull(ReadOnlySpan<byte> cell)
    {
        if (cell.IsEmpty) return true;
        foreach (var t in _nullTokensUtf8) if (cell.SequenceEqual(t)) return true;
        return false;
    }

    private bool IsNull(string cell) => cell.Length == 0 || Array.IndexOf(_nullTokens, cell) >= 0;
}

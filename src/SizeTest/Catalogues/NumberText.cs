using System.Globalization;

namespace SizeTest.Catalogues;

/// <summary>
/// The one parser of numbers written as text in any catalogue format (CSV/whitespace cells, FITS
/// ASCII-table and string cells, VOTable TABLEDATA, Parquet string columns). Besides the invariant-culture
/// decimal forms it reads the usual spellings of non-finite values — <c>inf</c>, <c>infinity</c>,
/// <c>nan</c> in any letter case, with an optional sign, and <c>∞</c> — so that every reader hands
/// them to the loader as numbers and the loader rejects them all with one reason
/// (<see cref="RejectReason.NonFinite"/>), instead of some being "unparsable" and others "out of range".
/// </summary>
public static class NumberText
{
    /// <summary>Parses <paramref name="text"/> as a number (finite or not); false when it is no number at all.</summary>
    public static bool TryParse(ReadOnlySpan<char> text, out double value)
    {
        if (double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out value)) return true;
        return TryParseNonFinite(text.Trim(), out value);
    }

    /// <summary>Reads the spelled-out non-finite forms only (<c>inf</c>, <c>-Infinity</c>, <c>NaN</c>, <c>+∞</c>...).</summary>
    public static bool TryParseNonFinite(ReadOnlySpan<char> text, out double value)
    {
        value = 0;
        bool negative = false;
        if (text.Length > 0 && (text[0] == '+' || text[0] == '-')) { negative = text[0] == '-'; text = text[1..]; }
        if (text.Equals("inf", StringComparison.OrdinalIgnoreCase) || text.Equals("infinity", StringComparison.OrdinalIgnoreCase) || text.SequenceEqual("∞"))
        {
            value = negative ? double.NegativeInfinity : double.PositiveInfinity;
            return true;
        }
        if (text.Equals("nan", StringComparison.OrdinalIgnoreCase)) { value = double.NaN; return true; }
        return false;
    }
}

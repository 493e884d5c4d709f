using System.Globalization;
using System.Text;
using SizeTest.Foundation.Errors;

namespace SizeTest.Catalogues.Fits;

/// <summary>
/// A FITS header: 80-character cards in 2880-byte blocks up to the <c>END</c> card
/// (FITS Standard 4.0, IAU FITS Working Group 2018, §3.3 and §4). Parses fixed- and free-format
/// values, quoted strings with doubled quotes, comments, and joins long strings continued with
/// <c>&amp;</c> + <c>CONTINUE</c> cards (§4.2.1.2); other CONTINUE cards are ignored.
/// </summary>
internal sealed class FitsHeader
{
    public const int CardBytes = 80;
    public const int BlockBytes = 2880;

    private readonly Dictionary<string, FitsCard> _first = new(StringComparer.Ordinal);

    private FitsHeader(List<FitsCard> cards, long byteLength)
    {
        Cards = cards;
        ByteLength = byteLength;
        foreach (var c in cards)
            if (c.Value is not null) _first.TryAdd(c.Keyword, c);
    }

    /// <summary>The cards before END, in order.</summary>
    public IReadOnlyList<FitsCard> Cards { get; }

    /// <summary>Bytes the header occupies (a multiple of 2880).</summary>
    public long ByteLength { get; }

    /// <summary>The first card with this keyword that has a value, or null.</summary>
    public FitsCard? this[string keyword] => _first.TryGetValue(keyword, out var c) ? c : null;

    /// <summary>
    /// Reads a header starting at <paramref name="offset"/>. Throws <see cref="InputException"/> when
    /// the file ends before the END card or inside a block.
    /// </summary>
    public static FitsHeader Read(Stream stream, long offset, string path, int hduIndex)
    {
        var cards = new List<FitsCard>();
        var block = new byte[BlockBytes];
        long pos = offset;
        stream.Position = offset;
        while (true)
        {
            int n = stream.ReadAtLeast(block, BlockBytes, throwOnEndOfStream: false);
            if (n < BlockBytes)
                throw new InputException(n == 0 && cards.Count == 0
                        ? $"the file ends where header {hduIndex} should start (byte {pos})"
                        : $"the FITS file is truncated: header {hduIndex} ends at byte {pos + n} inside a 2880-byte block, before its END card", path, line: null);
            for (int c = 0; c < 36; c++)
            {
                var card = block.AsSpan(c * CardBytes, CardBytes);
                var keyword = Ascii(card[..8]).TrimEnd();
                if (keyword == "END") return new FitsHeader(cards, pos + BlockBytes - offset);
                ParseCard(card, keyword, cards);
            }
            pos += BlockBytes;
        }
    }

    private static string Ascii(ReadOnlySpan<byte> b)
    {
        var chars = new char[b.Length];
        for (int i = 0; i < b.Length; i++) chars[i] = b[i] is >= 32 and <= 126 ? (char)b[i] : ' ';
        return new string(chars);
    }

    private static void ParseCard(ReadOnlySpan<byte> card, string keyword, List<FitsCard> cards)
    {
        var text = Ascii(card);
        if (keyword == "CONTINUE")
        {
            // Long-string convention: the previous string value ended with '&'.
            if (cards.Count > 0 && cards[^1] is { IsString: true, Value: { } prev } last && prev.EndsWith('&'))
            {
                var (piece, _, comment) = ParseValue(text[8..]);
                if (piece is not null)
                {
                    cards[^1] = last with { Value = prev[..^1] + piece, Comment = comment ?? last.Comment };
                    return;
                }
            }
            cards.Add(new FitsCard(keyword, null, false, text[8..].Trim(), cards.Count));
            return;
        }
        if (text.Length >= 10 && text[8] == '=' && text[9] == ' ')
        {
            var (value, isString, comment) = ParseValue(text[10..]);
            cards.Add(new FitsCard(keyword, value, isString, comment, cards.Count));
        }
        else
        {
            cards.Add(new FitsCard(keyword, null, false, text[8..].TrimEnd(), cards.Count));
        }
    }

    /// <summary>Parses the value field (after <c>= </c>): a quoted string or a token, then an optional <c>/ comment</c>.</summary>
    internal static (string? Value, bool IsString, string? Comment) ParseValue(string field)
    {
        int i = 0;
        while (i < field.Length && field[i] == ' ') i++;
        if (i < field.Length && field[i] == '\'')
        {
            var sb = new StringBuilder();
            i++;
            bool closed = false;
            while (i < field.Length)
            {
                if (field[i] == '\'')
                {
                    if (i + 1 < field.Length && field[i + 1] == '\'') { sb.Append('\''); i += 2; continue; }
                    i++;
                    closed = true;
                    break;
                }
                sb.Append(field[i++]);
            }
            if (!closed) return (sb.ToString().TrimEnd(), true, null);
            int slash = field.IndexOf('/', i);
            return (sb.ToString().TrimEnd(), true, slash >= 0 ? field[(slash + 1)..].Trim() : null);
        }
        int s = field.IndexOf('/', i);
        var token = (s >= 0 ? field[i..s] : field[i..]).Trim();
        return (token.Length == 0 ? null : token, false, s >= 0 ? field[(s + 1)..].Trim() : null);
    }

    /// <summary>An integer keyword, or <paramref name="fallback"/> when absent; throws when present but not an integer.</summary>
    public long GetInteger(string keyword, long? fallback, string path, int hduIndex)
    {
        var c = this[keyword];
        if (c?.Value is null)
            return fallback ?? throw new InputException($"header {hduIndex} lacks the required keyword {keyword}", path);
        if (!c.IsString && long.TryParse(c.Value, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out var v)) return v;
        throw new InputException($"header {hduIndex} keyword {keyword} = {c.Value} is not an integer", path);
    }

    /// <summary>A real keyword (Fortran <c>D</c> exponents accepted), or <paramref name="fallback"/> when absent.</summary>
    public double GetReal(string keyword, double fallback, string path, int hduIndex)
    {
        var c = this[keyword];
        if (c?.Value is null) return fallback;
        if (!c.IsString && TryParseReal(c.Value, out var v)) return v;
        throw new InputException($"header {hduIndex} keyword {keyword} = {c.Value} is not a number", path);
    }

    /// <summary>Parses a FITS real value (<c>1.5E3</c>, <c>1.5D3</c>, <c>42</c>).</summary>
    public static bool TryParseReal(string text, out double value) =>
        double.TryParse(text.Replace('D', 'E').Replace('d', 'e'), NumberStyles.Float, CultureInfo.InvariantCulture, out value);

    /// <summary>A string keyword, or null.</summary>
    public string? GetString(string keyword) => this[keyword] is { IsString: true } c ? c.Value : null;
}

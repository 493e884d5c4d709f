namespace SizeTest.Catalogues.Fits;

/// <summary>One parsed header keyword (FITS Standard 4.0, §4.1–4.2).</summary>
/// <param name="Keyword">Columns 1–8, trimmed.</param>
/// <param name="Value">The value: string contents (quotes removed, <c>''</c> unescaped, trailing blanks dropped, CONTINUE pieces joined), or the value token as written (<c>T</c>, <c>42</c>, <c>1.5D3</c>); null for commentary cards.</param>
/// <param name="IsString">Whether the value was a quoted string.</param>
/// <param name="Comment">The text after <c>/</c>, trimmed, or null.</param>
/// <param name="Index">0-based position of the card in the header.</param>
internal sealed record FitsCard(string Keyword, string? Value, bool IsString, string? Comment, int Index);

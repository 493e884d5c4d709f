namespace SizeTest.Foundation.Text;

/// <summary>
/// "Did you mean …" suggestions for mistyped names (verbs, options, option values, world models, study-file keys, columns):
/// the known name at the smallest Damerau–Levenshtein distance from the word (Damerau 1964; Lowrance &amp; Wagner 1975:
/// insertions, deletions, substitutions and transpositions of adjacent characters cost 1), compared case-insensitively.
/// A name is offered only within <see cref="MaxDistance"/> of the word (2, or 1 for a name of at most 4 characters), so
/// unrelated words get no suggestion; of names equally close, the one nearest the word's length, then the ordinally first.
/// </summary>
public static class NameSuggestions
{
    /// <summary>The largest distance at which <paramref name="name"/> is offered: 1 for a name of at most 4 characters, else 2.</summary>
    public static int MaxDistance(string name)
    {
        ArgumentNullException.ThrowIfNull(name);
        return name.Length <= 4 ? 1 : 2;
    }

    /// <summary>The closest known name within <see cref="MaxDistance"/>, or null when none is close enough or the word is
    /// itself one of them (exactly; a name differing only in case is offered).</summary>
    public static string? Closest(string word, IEnumerable<string> known)
    {
        ArgumentNullException.ThrowIfNull(word);
        ArgumentNullException.ThrowIfNull(known);
        string w = word.ToLowerInvariant();
        string? best = null;
        int bestD = int.MaxValue;
        foreach (var k in known)
        {
            if (k == word) return null;
            int d = Distance(w, k.ToLowerInvariant());
            if (d > MaxDistance(k)) continue;
            if (d > bestD) continue;
            if (d == bestD)
            {
                int byLength = Math.Abs(k.Length - word.Length).CompareTo(Math.Abs(best!.Length - word.Length));
                if (byLength > 0 || (byLength == 0 && string.CompareOrdinal(k, best) >= 0)) continue;
            }
            bestD = d;
            best = k;
        }
        return best;
    }

    /// <summary>" (did you mean 'x'?)" for the <see cref="Closest"/> name, or empty, for appending to an error sentence.</summary>
    public static string Hint(string word, IEnumerable<string> known) =>
        Closest(word, known) is { } s ? DidYouMean(s) : "";

    /// <summary>" (did you mean '<paramref name="name"/>'?)", for a suggestion found otherwise (a name compared in parts).</summary>
    public static string DidYouMean(string name) => $" (did you mean '{name}'?)";

    /// <summary>
    /// The (unrestricted) Damerau–Levenshtein distance, by the dynamic programme of Lowrance &amp; Wagner (1975) with the last
    /// row of each character: unlike the optimal-string-alignment variant, a substring may be edited after a transposition
    /// (<c>ca</c> → <c>abc</c> is 2: swap to <c>ac</c>, insert <c>b</c>).
    /// </summary>
    public static int Distance(string a, string b)
    {
        ArgumentNullException.ThrowIfNull(a);
        ArgumentNullException.ThrowIfNull(b);
        int inf = a.Length + b.Length;
        var d = new int[a.Length + 2, b.Length + 2];
        d[0, 0] = inf;
        for (int i = 0; i <= a.Length; i++) { d[i + 1, 0] = inf; d[i + 1, 1] = i; }
        for (int j = 0; j <= b.Length; j++) { d[0, j + 1] = inf; d[1, j + 1] = j; }
        var lastRow = new Dictionary<char, int>();
        for (int i = 1; i <= a.Length; i++)
        {
            int lastMatchColumn = 0;
            for (int j = 1; j <= b.Length; j++)
            {
                int k = lastRow.GetValueOrDefault(b[j - 1]), l = lastMatchColumn;
                int cost = a[i - 1] == b[j - 1] ? 0 : 1;
                if (cost == 0) lastMatchColumn = j;
                d[i + 1, j + 1] = Math.Min(Math.Min(d[i, j] + cost, d[i + 1, j] + 1),
                    Math.Min(d[i, j + 1] + 1, d[k, l] + (i - k - 1) + 1 + (j - l - 1)));
            }
            lastRow[a[i - 1]] = i;
        }
        return d[a.Length + 1, b.Length + 1];
    }
}

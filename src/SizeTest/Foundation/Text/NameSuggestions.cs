namespace SizeTest.Foundation.Text;

/// <summary>
/// "Did you mean …" suggestions for mistyped names (verbs, world models, study-file keys): the known name at the
/// smallest Levenshtein edit distance (Levenshtein 1966; insertions, deletions and substitutions cost 1, compared
/// case-insensitively), offered only when that distance is at most a third of the word's length (at least 1, at
/// most 3) so that unrelated words get no suggestion.
/// </summary>
public static class NameSuggestions
{
    /// <summary>The closest known name, or null when none is close enough (or the word is itself known).</summary>
    public static string? Closest(string word, IEnumerable<string> known)
    {
        ArgumentNullException.ThrowIfNull(word);
        ArgumentNullException.ThrowIfNull(known);
        string w = word.ToLowerInvariant();
        int limit = Math.Clamp(w.Length / 3, 1, 3);
        string? best = null;
        int bestD = int.MaxValue;
        foreach (var k in known)
        {
            int d = Distance(w, k.ToLowerInvariant());
            if (d == 0) return null;
            if (d < bestD || (d == bestD && string.CompareOrdinal(k, best) < 0)) { bestD = d; best = k; }
        }
        return bestD <= limit ? best : null;
    }

    /// <summary>" (did you mean 'x'?)" or empty, for appending to an error sentence.</summary>
    public static string Hint(string word, IEnumerable<string> known) =>
        Closest(word, known) is { } s ? $" (did you mean '{s}'?)" : "";

    /// <summary>Levenshtein distance by the two-row dynamic programme (Wagner &amp; Fischer 1974).</summary>
    public static int Distance(string a, string b)
    {
        ArgumentNullException.ThrowIfNull(a);
        ArgumentNullException.ThrowIfNull(b);
        var prev = new int[b.Length + 1];
        var cur = new int[b.Length + 1];
        for (int j = 0; j <= b.Length; j++) prev[j] = j;
        for (int i = 1; i <= a.Length; i++)
        {
            cur[0] = i;
            for (int j = 1; j <= b.Length; j++)
                cur[j] = Math.Min(Math.Min(cur[j - 1] + 1, prev[j] + 1), prev[j - 1] + (a[i - 1] == b[j - 1] ? 0 : 1));
            (prev, cur) = (cur, prev);
        }
        return prev[b.Length];
    }
}

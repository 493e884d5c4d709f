namespace SizeTest.Catalogues;

/// <summary>
/// Gives each column of a table a distinct name: the second and later columns called <c>x</c> become
/// <c>x_2</c>, <c>x_3</c>, … (skipping names already taken). Amortised constant time per name, so a damaged
/// header with tens of thousands of equal names is not a cubic-time trap (found by the fuzz suite).
/// </summary>
public sealed class UniqueColumnNames
{
    private readonly HashSet<string> _taken = new(StringComparer.Ordinal);
    private readonly Dictionary<string, int> _next = new(StringComparer.Ordinal);

    private int _renamed;
    private string? _first;

    /// <summary>Returns <paramref name="name"/> if it is still free, otherwise the first free <c>name_k</c> (k ≥ 2), and takes it.</summary>
    /// <param name="name">The name in the file.</param>
    /// <param name="position">The column's 1-based position, for <see cref="Warning"/> (0: not told).</param>
    public string Take(string name, int position = 0)
    {
        if (_taken.Add(name)) return name;
        int k = _next.TryGetValue(name, out var n) ? n : 2;
        string unique;
        while (!_taken.Add(unique = $"{name}_{k}")) k++;
        _next[name] = k + 1;
        if (_renamed++ == 0)
            _first = (position > 0 ? $"column {position} " : "a column ") + $"'{name}' is read as '{unique}'";
        return unique;
    }

    /// <summary>
    /// A warning (with the <c>warning: </c> prefix) when any name was taken twice, since a renamed column would otherwise
    /// go unnoticed (issue 14 point 8); null when every name was distinct.
    /// </summary>
    public string? Warning() => _renamed == 0 ? null
        : $"warning: {_renamed} column{(_renamed == 1 ? " repeats the name" : "s repeat the names")} of an earlier column ({_first}{(_renamed > 1 ? ", and so on" : "")}); map such a column by its new name";
}

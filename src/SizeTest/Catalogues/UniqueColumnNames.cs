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

    /// <summary>Returns <paramref name="name"/> if it is still free, otherwise the first free <c>name_k</c> (k ≥ 2), and takes it.</summary>
    public string Take(string name)
    {
        if (_taken.Add(name)) return name;
        int k = _next.TryGetValue(name, out var n) ? n : 2;
        string unique;
        while (!_taken.Add(unique = $"{name}_{k}")) k++;
        _next[name] = k + 1;
        return unique;
    }
}

namespace SizeTest.Foundation.Text;

/// <summary>
/// The one spelling of each value of an enum of the vocabulary, used alike on the command line, in study files and
/// in result files: exact, lower-case words, in display order.
/// </summary>
/// <typeparam name="T">The enum.</typeparam>
/// <param name="noun">What a value is called in messages ("observable", "sampler").</param>
/// <param name="all">Every value with its spelling, in display order.</param>
public sealed class Spellings<T>(string noun, IReadOnlyList<(T Kind, string Name)> all) where T : struct, Enum
{
    /// <summary>Every value with its spelling, in display order.</summary>
    public IReadOnlyList<(T Kind, string Name)> All { get; } = all;

    /// <summary>The spellings, in display order.</summary>
    public IReadOnlyList<string> Names { get; } = all.Select(x => x.Name).ToArray();

    /// <summary>The spelling of <paramref name="kind"/>.</summary>
    public string Name(T kind)
    {
        foreach (var (k, n) in All)
            if (EqualityComparer<T>.Default.Equals(k, kind)) return n;
        throw new ArgumentOutOfRangeException(nameof(kind), kind, $"{typeof(T).Name}.{kind} has no spelling");
    }

    /// <summary>The value spelt <paramref name="name"/> (exact), or false.</summary>
    public bool TryParse(string? name, out T kind)
    {
        foreach (var (k, n) in All)
            if (string.Equals(n, name, StringComparison.Ordinal)) { kind = k; return true; }
        kind = default;
        return false;
    }

    /// <summary>The value spelt <paramref name="name"/>; an <see cref="ArgumentException"/> naming the choices otherwise.</summary>
    public T Parse(string name) =>
        TryParse(name, out var kind) ? kind : throw new ArgumentException($"unknown {noun} '{name}'{NameSuggestions.Hint(name, Names)}; use {string.Join(", ", Names)}");
}

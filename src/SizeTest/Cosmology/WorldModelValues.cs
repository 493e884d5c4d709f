namespace SizeTest.Cosmology;

/// <summary>
/// A family's resolved parameter values as its factory sees them: looked up by
/// <see cref="ParameterSpec"/> (by name), never by position, so the order of a family's
/// parameter list cannot silently hand one parameter's value to another. Asking for a
/// parameter the family does not declare throws (a programming error, caught when the
/// family is defined: see <see cref="WorldModelFamily"/>).
/// </summary>
public readonly ref struct WorldModelValues
{
    private readonly ReadOnlySpan<double> _values;
    private readonly IReadOnlyList<ParameterSpec> _specs;
    private readonly string _family;
    private readonly Span<bool> _read;

    /// <summary>Wraps <paramref name="values"/>, given in the order of <paramref name="specs"/>;
    /// <paramref name="read"/> (empty, or one flag per spec) records which parameters the factory asked for.</summary>
    internal WorldModelValues(string family, IReadOnlyList<ParameterSpec> specs, ReadOnlySpan<double> values, Span<bool> read)
    {
        _family = family;
        _specs = specs;
        _values = values;
        _read = read;
    }

    /// <summary>The value of <paramref name="spec"/> (NaN when a derived default was left out).</summary>
    public double this[ParameterSpec spec] => _values[IndexOf(spec)];

    /// <summary>The value of <paramref name="spec"/>, or null when it was left out and its default is derived
    /// from the others (<see cref="ParameterSpec.DefaultIsDerived"/>).</summary>
    public double? Optional(ParameterSpec spec)
    {
        double v = this[spec];
        return double.IsNaN(v) ? null : v;
    }

    private int IndexOf(ParameterSpec spec)
    {
        ArgumentNullException.ThrowIfNull(spec);
        for (int i = 0; i < _specs.Count; i++)
        {
            if (!string.Equals(_specs[i].Name, spec.Name, StringComparison.Ordinal)) continue;
            if (!_read.IsEmpty) _read[i] = true;
            return i;
        }
        throw new InvalidOperationException(
            $"World model '{_family}' reads parameter '{spec.Name}', which its parameter list ({string.Join(", ", _specs.Select(p => p.Name))}) does not declare.");
    }
}

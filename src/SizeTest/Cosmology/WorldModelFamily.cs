using System.Diagnostics.CodeAnalysis;
using System.Globalization;

namespace SizeTest.Cosmology;

/// <summary>
/// A world-model family defined by its parameter list and a factory. Resolves defaults,
/// checks names and ranges, and lets the factory refuse combinations (no big bang)
/// without throwing. Instances live in <see cref="WorldModels"/>.
/// </summary>
public sealed class WorldModelFamily : IWorldModelFamily
{
    /// <summary>
    /// Builds a model from the resolved values, read by spec (NaN = derived default).
    /// Returns null and a message when the combination is refused.
    /// </summary>
    public delegate IWorldModel? Factory(WorldModelValues values, out string? error);

    private readonly ParameterSpec[] _parameters;
    private readonly Factory _factory;

    /// <summary>
    /// Defines a family. The factory is called once here with the defaults: it must read every
    /// declared parameter and no other (a parameter left out of the list, or declared but never
    /// used, throws <see cref="InvalidOperationException"/> at definition, not at a fit).
    /// </summary>
    public WorldModelFamily(string name, string description, bool isExpanding, string dimmingLaw, IReadOnlyList<ParameterSpec> parameters, Factory factory)
    {
        Name = name;
        Description = description;
        IsExpanding = isExpanding;
        DimmingLaw = dimmingLaw;
        _parameters = parameters.ToArray();
        _factory = factory;
        CheckFactoryReadsExactlyTheDeclaredParameters();
    }

    private void CheckFactoryReadsExactlyTheDeclaredParameters()
    {
        var duplicate = _parameters.GroupBy(p => p.Name, StringComparer.Ordinal).FirstOrDefault(g => g.Count() > 1);
        if (duplicate is not null)
            throw new InvalidOperationException($"World model '{Name}' declares parameter '{duplicate.Key}' twice.");
        Span<double> defaults = stackalloc double[_parameters.Length];
        for (int i = 0; i < _parameters.Length; i++) defaults[i] = _parameters[i].Default;
        Span<bool> read = stackalloc bool[_parameters.Length];
        _factory(new WorldModelValues(Name, _parameters, defaults, read), out _);
        for (int i = 0; i < _parameters.Length; i++)
            if (!read[i])
                throw new InvalidOperationException($"World model '{Name}' declares parameter '{_parameters[i].Name}', which its factory never reads.");
    }

    /// <inheritdoc/>
    public string Name { get; }

    /// <inheritdoc/>
    public string Description { get; }

    /// <inheritdoc/>
    public bool IsExpanding { get; }

    /// <inheritdoc/>
    public string DimmingLaw { get; }

    /// <inheritdoc/>
    public IReadOnlyList<ParameterSpec> Parameters => _parameters;

    /// <inheritdoc/>
    public IWorldModel Create(IReadOnlyDictionary<string, double> values)
        => TryCreate(values, out var model, out var error) ? model : throw new ArgumentException(error);

    /// <inheritdoc/>
    public bool TryCreate(IReadOnlyDictionary<string, double> values, [NotNullWhen(true)] out IWorldModel? model, [NotNullWhen(false)] out string? error)
    {
        ArgumentNullException.ThrowIfNull(values);
        Span<double> v = stackalloc double[_parameters.Length];
        for (int i = 0; i < _parameters.Length; i++) v[i] = _parameters[i].Default;
        foreach (var (key, value) in values)
        {
            int index = IndexOf(key);
            if (index < 0)
            {
                model = null;
                error = $"World model '{Name}' has no parameter '{key}'; its parameters are {string.Join(", ", _parameters.Select(p => p.Name))}.";
                return false;
            }
            var spec = _parameters[index];
            if (double.IsNaN(value) && spec.DefaultIsDerived)
            {
                v[index] = double.NaN;
                continue;
            }
            if (!spec.Allows(value))
            {
                model = null;
                error = string.Create(CultureInfo.InvariantCulture,
                    $"{key} = {value:G6} is outside the allowed range [{spec.Min:G6}, {spec.Max:G6}] of world model '{Name}'.");
                return false;
            }
            v[index] = value;
        }
        model = _factory(new WorldModelValues(Name, _parameters, v, []), out string? refusal);
        if (model is null)
        {
            error = refusal ?? $"World model '{Name}' refused these parameter values.";
            return false;
        }
        error = null;
        return true;
    }

    /// <summary>The same family with its parameter list in another order or with parameters left
    /// out (tests of the by-spec lookup: reordering changes nothing, leaving one out throws).</summary>
    internal WorldModelFamily WithParameters(IReadOnlyList<ParameterSpec> parameters)
        => new(Name, Description, IsExpanding, DimmingLaw, parameters, _factory);

    /// <summary>Index of parameter <paramref name="name"/>, or −1.</summary>
    public int IndexOf(string name)
    {
        for (int i = 0; i < _parameters.Length; i++)
            if (string.Equals(_parameters[i].Name, name, StringComparison.Ordinal)) return i;
        return -1;
    }

    /// <inheritdoc/>
    public override string ToString() => Name;
}

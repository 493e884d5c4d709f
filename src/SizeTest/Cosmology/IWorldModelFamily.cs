namespace SizeTest.Cosmology;

/// <summary>
/// A family of world models (e.g. ΛCDM) with declared parameters; builds a fixed
/// <see cref="IWorldModel"/> from parameter values. Fitters call <see cref="Create"/> once per
/// parameter vector, so it must be cheap (no quadrature at construction beyond a small grid).
/// </summary>
public interface IWorldModelFamily
{
    /// <summary>Name used with <c>--model</c>.</summary>
    string Name { get; }

    /// <summary>One-line description, including the dimming law it implies.</summary>
    string Description { get; }

    /// <summary>True for FLRW families.</summary>
    bool IsExpanding { get; }

    /// <summary>The family's parameters with defaults, units and ranges.</summary>
    IReadOnlyList<ParameterSpec> Parameters { get; }

    /// <summary>
    /// Builds a model. Parameters not given take their defaults; unknown names or values
    /// outside their range, or combinations with no big bang, throw <see cref="ArgumentException"/>
    /// with a message fit for the user.
    /// </summary>
    IWorldModel Create(IReadOnlyDictionary<string, double> values);

    /// <summary>
    /// Like <see cref="Create"/> but reports a refused parameter set through
    /// <paramref name="error"/> (the same message) instead of throwing: the cheap path for
    /// samplers that meet invalid regions often.
    /// </summary>
    bool TryCreate(IReadOnlyDictionary<string, double> values, [System.Diagnostics.CodeAnalysis.NotNullWhen(true)] out IWorldModel? model, [System.Diagnostics.CodeAnalysis.NotNullWhen(false)] out string? error);

    /// <summary>The bolometric surface-brightness dimming law the family implies, in words, e.g. <c>(1+z)^-4</c>.</summary>
    string DimmingLaw { get; }
}

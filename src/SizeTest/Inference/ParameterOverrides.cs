namespace SizeTest.Inference;

/// <summary>
/// User choices that change the default status of parameters, applied to every hypothesis that has
/// the parameter (a name unknown to one world model is ignored for it).
/// </summary>
/// <param name="Free">Names to make free (within their spec's bounds).</param>
/// <param name="Fixed">Names to hold at a value.</param>
/// <param name="Priors">Names to give a Gaussian prior (mean, standard deviation).</param>
/// <param name="Bounds">Optional narrower bounds (min, max) for free parameters.</param>
public sealed record ParameterOverrides(
    IReadOnlySet<string>? Free = null,
    IReadOnlyDictionary<string, double>? Fixed = null,
    IReadOnlyDictionary<string, (double Mean, double Sd)>? Priors = null,
    IReadOnlyDictionary<string, (double Min, double Max)>? Bounds = null)
{
    /// <summary>No overrides.</summary>
    public static ParameterOverrides None { get; } = new();

    /// <summary>Every parameter name mentioned.</summary>
    public IEnumerable<string> Names =>
        (Free ?? new HashSet<string>()).Concat(Fixed?.Keys ?? []).Concat(Priors?.Keys ?? []).Concat(Bounds?.Keys ?? []).Distinct();
}

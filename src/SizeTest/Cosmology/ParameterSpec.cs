namespace SizeTest.Cosmology;

/// <summary>
/// Declares one named parameter: its unit, default, allowed range and meaning. The same
/// object serves the command line (option names and help), the fitter (bounds) and the
/// report (labels).
/// </summary>
/// <param name="Name">Machine name, e.g. <c>omega_m</c>, <c>h0</c>, <c>size_evolution</c>.</param>
/// <param name="Symbol">Plain-text symbol for tables, e.g. <c>Ωm</c>.</param>
/// <param name="Unit">Unit, or empty for dimensionless.</param>
/// <param name="Default">Default value.</param>
/// <param name="Min">Smallest allowed value (inclusive).</param>
/// <param name="Max">Largest allowed value (inclusive).</param>
/// <param name="Description">One line saying what it is.</param>
public sealed record ParameterSpec(string Name, string Symbol, string Unit, double Default, double Min, double Max, string Description)
{
    /// <summary>True when <paramref name="value"/> is finite and within [Min, Max].</summary>
    public bool Allows(double value) => double.IsFinite(value) && value >= Min && value <= Max;

    /// <summary>
    /// True when <see cref="Default"/> is NaN, meaning "not given: derived from the other
    /// parameters" (e.g. <c>omega_lambda</c> not given = flat, 1 − Ωm − Ωr). Passing NaN for
    /// such a parameter is the same as leaving it out.
    /// </summary>
    public bool DefaultIsDerived => double.IsNaN(Default);
}

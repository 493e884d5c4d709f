namespace SizeTest.Studies;

/// <summary>How a study file sets one parameter: free, fixed at a value, or free with a Gaussian prior; optionally narrower bounds.</summary>
/// <param name="Name">Parameter name (e.g. <c>omega_m</c>, <c>size_evolution</c>).</param>
/// <param name="Status">Free, fixed or prior.</param>
/// <param name="Value">Fixed value (null: the parameter's default).</param>
/// <param name="PriorMean">Prior mean when <paramref name="Status"/> is prior.</param>
/// <param name="PriorSd">Prior standard deviation when <paramref name="Status"/> is prior.</param>
/// <param name="Min">Narrower lower bound for a free parameter, or null.</param>
/// <param name="Max">Narrower upper bound, or null.</param>
public sealed record StudyParameter(string Name, Inference.ParameterStatus Status, double? Value = null, double? PriorMean = null,
    double? PriorSd = null, double? Min = null, double? Max = null);

namespace SizeTest.Inference;

/// <summary>
/// One parameter of a fitted model as reported: best value and its 68% interval, with how the interval was
/// obtained (<see cref="IntervalMethod"/>) and whether the maximum sits on a bound of the parameter's range.
/// </summary>
/// <param name="Name">Machine name (e.g. <c>omega_m</c>, <c>size_evolution</c>, <c>scatter_dex</c>).</param>
/// <param name="Value">Best estimate (maximum likelihood, or posterior median when sampled).</param>
/// <param name="Lo">Lower end of the 68% interval (equals <see cref="Value"/> when fixed).</param>
/// <param name="Hi">Upper end of the 68% interval.</param>
/// <param name="Fixed">True when the parameter was held fixed.</param>
/// <param name="Unit">Unit, or empty.</param>
/// <param name="IntervalMethod">How <paramref name="Lo"/>–<paramref name="Hi"/> was obtained: one of the
/// <see cref="IntervalMethods"/> names (<c>hessian</c>, <c>profile</c>, <c>posterior</c>, <c>bootstrap</c>; <c>fixed</c>
/// for a parameter held fixed).</param>
/// <param name="AtBound"><c>lower</c> or <c>upper</c> when the maximum lies on that bound (the interval is then one-sided:
/// from the bound to the profile's Δ ln L = ½ crossing on the other side), otherwise null.</param>
public sealed record ParameterEstimate(string Name, double Value, double Lo, double Hi, bool Fixed, string Unit = "",
    string IntervalMethod = IntervalMethods.Hessian, string? AtBound = null);

namespace SizeTest.Inference;

/// <summary>
/// One parameter of a fitted model as reported: best value and its 68% interval
/// (Hessian ±1σ for maximum likelihood; 16th–84th percentiles when sampled).
/// </summary>
/// <param name="Name">Machine name (e.g. <c>omega_m</c>, <c>size_evolution</c>, <c>scatter_dex</c>).</param>
/// <param name="Value">Best estimate (maximum likelihood, or posterior median when sampled).</param>
/// <param name="Lo">Lower end of the 68% interval (equals <see cref="Value"/> when fixed).</param>
/// <param name="Hi">Upper end of the 68% interval.</param>
/// <param name="Fixed">True when the parameter was held fixed.</param>
/// <param name="Unit">Unit, or empty.</param>
public sealed record ParameterEstimate(string Name, double Value, double Lo, double Hi, bool Fixed, string Unit = "");

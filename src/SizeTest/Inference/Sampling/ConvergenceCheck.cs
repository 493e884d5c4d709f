namespace SizeTest.Inference.Sampling;

/// <summary>One convergence check of one parameter (or of the whole run) with its threshold.</summary>
/// <param name="Name">Check name: <c>length_in_tau</c>, <c>rhat</c>, <c>ess</c>, <c>acceptance</c>, <c>tau_window</c>.</param>
/// <param name="Parameter">Parameter name, or empty for run-wide checks.</param>
/// <param name="Value">Measured value (NaN when it could not be computed).</param>
/// <param name="Threshold">Threshold it was compared against (for acceptance, the violated bound or the lower bound).</param>
/// <param name="Passed">Whether the check passed.</param>
/// <param name="Message">One sentence saying what was measured and what is required.</param>
public sealed record ConvergenceCheck(string Name, string Parameter, double Value, double Threshold, bool Passed, string Message);

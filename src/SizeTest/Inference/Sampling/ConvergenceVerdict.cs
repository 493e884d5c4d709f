namespace SizeTest.Inference.Sampling;

/// <summary>One convergence check of one parameter (or of the whole run) with its threshold.</summary>
/// <param name="Name">Check name: <c>length_in_tau</c>, <c>rhat</c>, <c>ess</c>, <c>acceptance</c>, <c>tau_window</c>.</param>
/// <param name="Parameter">Parameter name, or empty for run-wide checks.</param>
/// <param name="Value">Measured value (NaN when it could not be computed).</param>
/// <param name="Threshold">Threshold it was compared against (for acceptance, the violated bound or the lower bound).</param>
/// <param name="Passed">Whether the check passed.</param>
/// <param name="Message">One sentence saying what was measured and what is required.</param>
public sealed record ConvergenceCheck(string Name, string Parameter, double Value, double Threshold, bool Passed, string Message);

/// <summary>
/// Whether a sampled posterior may be reported as converged, with every check and the reasons
/// for a negative verdict. Never silent: <see cref="Reasons"/> is non-empty whenever
/// <see cref="Converged"/> is false.
/// </summary>
/// <param name="Checks">All checks performed.</param>
public sealed record ConvergenceVerdict(IReadOnlyList<ConvergenceCheck> Checks)
{
    /// <summary>True when every check passed (and at least one was made).</summary>
    public bool Converged => Checks.Count > 0 && Checks.All(c => c.Passed);

    /// <summary>Messages of the failed checks.</summary>
    public IReadOnlyList<string> Reasons => [.. Checks.Where(c => !c.Passed).Select(c => c.Message)];

    /// <summary>One line: "converged" or "not converged: reason; reason; …".</summary>
    public string Summary => Converged ? "converged" : "not converged: " + string.Join("; ", Reasons);
}

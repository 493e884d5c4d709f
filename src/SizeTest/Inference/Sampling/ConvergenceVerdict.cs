namespace SizeTest.Inference.Sampling;

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

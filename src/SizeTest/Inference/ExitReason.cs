namespace SizeTest.Inference;

/// <summary>The one cause that decided how a fit ended (the first failed check, or <see cref="Converged"/>).</summary>
public enum ExitCause
{
    /// <summary>Every convergence check passed.</summary>
    Converged,
    /// <summary>Every parameter is fixed: nothing was optimised.</summary>
    NothingToFit,
    /// <summary>The likelihood is not finite anywhere the search went.</summary>
    LikelihoodNotFinite,
    /// <summary>L-BFGS-B stopped without meeting its tolerance (iteration cap, failed line search).</summary>
    OptimiserStopped,
    /// <summary>A restart from the best point kept improving the maximum (a ridge or a very flat likelihood).</summary>
    RestartImproved,
    /// <summary>The curvature matrix at the maximum is not negative definite.</summary>
    CurvatureNotDefinite,
    /// <summary>The gradient at the maximum is still too long in units of the standard errors.</summary>
    GradientRemaining,
    /// <summary>The posterior sampler run after the fit did not converge.</summary>
    SamplerNotConverged,
    /// <summary>Read back from a results.json, which keeps only the sentence.</summary>
    Recorded,
}

/// <summary>
/// Why a fit stopped: the deciding <see cref="ExitCause"/> and the clauses that explain it, written to results.json as
/// one sentence (<see cref="Text"/>, clauses joined by "; ").
/// </summary>
/// <param name="Cause">The cause that decided the outcome.</param>
/// <param name="Clauses">The explanation, in the order the checks ran.</param>
[System.Text.Json.Serialization.JsonConverter(typeof(ExitReasonJsonConverter))]
public sealed record ExitReason(ExitCause Cause, IReadOnlyList<string> Clauses)
{
    /// <summary>No reason recorded (a summary built by hand).</summary>
    public static ExitReason None { get; } = new(ExitCause.Recorded, []);

    /// <summary>A reason of one clause.</summary>
    public ExitReason(ExitCause cause, string clause) : this(cause, [clause]) { }

    /// <summary>The sentence: the clauses joined by "; ".</summary>
    public string Text => string.Join("; ", Clauses);

    /// <summary>This reason with one more clause; the cause stays the one that decided.</summary>
    public ExitReason And(string clause) => this with { Clauses = [.. Clauses, clause] };

    /// <summary>This reason with one more clause; a failure (<paramref name="cause"/> not Converged) decides when this one converged.</summary>
    public ExitReason And(ExitCause cause, string clause) =>
        new(Cause == ExitCause.Converged && cause != ExitCause.Converged ? cause : Cause, [.. Clauses, clause]);

    /// <summary>A sentence read back from results.json.</summary>
    public static ExitReason FromText(string text) => text.Length == 0 ? None : new(ExitCause.Recorded, [text]);

    /// <inheritdoc/>
    public override string ToString() => Text;
}

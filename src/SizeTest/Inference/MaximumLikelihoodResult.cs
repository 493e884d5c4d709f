namespace SizeTest.Inference;

/// <summary>The outcome of a maximum-likelihood (or, with Gaussian priors, maximum-posterior) fit.</summary>
/// <param name="Theta">Best free-parameter vector.</param>
/// <param name="LogLikelihood">ln L at <paramref name="Theta"/> (data only).</param>
/// <param name="LogPosterior">Objective at the maximum (ln L + ln prior).</param>
/// <param name="Converged">Whether the search converged: the optimiser met its tolerance, a restart from the best
/// point did not improve it, the Hessian of the free (interior) parameters is negative definite (Cholesky) and the remaining
/// gradient is below 0.01 standard deviations.</param>
/// <param name="ExitReason">Why it stopped: the deciding cause and the sentence.</param>
/// <param name="Evaluations">Likelihood evaluations used.</param>
/// <param name="StartsAgreeing">How many of the starts reached the best maximum (within the agreement tolerance).</param>
/// <param name="Starts">Number of starts.</param>
/// <param name="Covariance">Covariance from the inverse negative Hessian (null when it is not positive definite).</param>
/// <param name="AtBound">For each free parameter, whether the maximum lies on (within 1e-6 of the range of) a bound.</param>
public sealed record MaximumLikelihoodResult(
    double[] Theta, double LogLikelihood, double LogPosterior, bool Converged, ExitReason ExitReason, int Evaluations,
    int StartsAgreeing, int Starts, double[,]? Covariance, bool[] AtBound)
{
    /// <summary>Why the optimiser stopped (typed).</summary>
    public OptimizerExit Exit { get; init; }

    /// <summary>√(gᵀ C g) at the maximum: how far (in standard deviations) the remaining gradient points; NaN without a covariance.</summary>
    public double GradientSigma { get; init; } = double.NaN;

    /// <summary>Correlation matrix of the free parameters (null without a covariance).</summary>
    public double[,]? Correlation { get; init; }

    /// <summary>Condition number of the unit-diagonal curvature matrix (ill-conditioning is reported, not refused).</summary>
    public double ConditionNumber { get; init; } = double.NaN;

    /// <summary>When the Hessian is singular or indefinite: the degenerate direction in words, named from its eigenvector.</summary>
    public string? Degeneracy { get; init; }

    /// <summary>Standard error of free parameter j (NaN without a covariance).</summary>
    public double StandardError(int j) => Covariance is null ? double.NaN : Math.Sqrt(Math.Max(0, Covariance[j, j]));
}

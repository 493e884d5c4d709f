namespace SizeTest.Inference;

/// <summary>
/// A log density with its gradient: gradient-based optimisers, the Hessian (central differences of the
/// gradient) and profile scans consume this seam. Same contract as <see cref="ILogDensity"/>: −∞ outside the
/// support, never NaN inside the bounds, safe to call from several threads at once.
/// </summary>
public interface ILogDensityWithGradient : ILogDensity
{
    /// <summary>
    /// Returns ln p(θ) and writes ∂ln p/∂θ_j into <paramref name="gradient"/> (length <see cref="ILogDensity.Dimension"/>,
    /// overwritten). Where ln p is −∞ the gradient is filled with zeros.
    /// </summary>
    double LogDensityAndGradient(ReadOnlySpan<double> theta, Span<double> gradient);
}

/// <summary>
/// A log-likelihood that is a sum over rows (objects), so that partial sums over row ranges [start, end) — of the value
/// and of the gradient — computed on threads or MPI ranks add up to the whole: <c>Prepare(θ)</c> once per parameter
/// vector (everything that depends only on θ and redshift: the world model and its grid of ln D_A and, when asked, its
/// parameter derivatives), then <c>SumSlice</c> / <c>SumSliceWithGradient</c> for each range, then add the parts.
/// Terms that do not depend on rows (a log prior) are not part of any slice: add them once (rank 0).
/// </summary>
/// <remarks>For every split 0 = s₀ &lt; s₁ &lt; … &lt; s_m = <see cref="Count"/>:
/// Σ_k SumSlice(e, s_k, s_{k+1}) = ln L(θ), and the gradient parts add up to ∇ln L(θ) (to rounding).</remarks>
public interface ISlicedLogLikelihood : ILogDensityWithGradient
{
    /// <summary>Number of rows (objects) n.</summary>
    int Count { get; }

    /// <summary>
    /// The per-evaluation state for θ, or null when θ is outside the bounds or the world model is undefined there
    /// (the whole ln L is then −∞). <paramref name="withGradient"/>: also prepare the parameter derivatives of the
    /// redshift-grid terms (needed by <see cref="SumSliceWithGradient"/>; costs extra world-model evaluations when
    /// cosmological parameters are free).
    /// </summary>
    LikelihoodEvaluation? Prepare(ReadOnlySpan<double> theta, bool withGradient);

    /// <summary>Sum of per-object log densities (all constants kept) over rows [start, end).</summary>
    double SumSlice(LikelihoodEvaluation evaluation, int start, int end);

    /// <summary>
    /// The same sum, and its gradient with respect to the free parameters written into <paramref name="gradient"/>
    /// (length Dimension, overwritten: the caller adds the parts). <paramref name="evaluation"/> must come from
    /// <c>Prepare(θ, withGradient: true)</c>.
    /// </summary>
    double SumSliceWithGradient(LikelihoodEvaluation evaluation, int start, int end, Span<double> gradient);
}

namespace SizeTest.Inference;

/// <summary>
/// A log density (log-likelihood, log-posterior) over a parameter vector of fixed
/// dimension. Optimisers, samplers and evidence estimators all consume this one seam.
/// Returns −∞ outside the support; never NaN for a point inside the declared bounds.
/// Implementations must be safe to call from several threads at once.
/// </summary>
public interface ILogDensity
{
    /// <summary>Number of parameters.</summary>
    int Dimension { get; }

    /// <summary>ln p(θ) up to a constant that does not depend on θ (the likelihood itself keeps all constants).</summary>
    double LogDensity(ReadOnlySpan<double> theta);
}

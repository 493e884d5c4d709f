namespace SizeTest.Inference.Sampling;

/// <summary>An integrated autocorrelation time estimate.</summary>
/// <param name="Tau">τ in steps (NaN for fewer than two samples).</param>
/// <param name="Window">Summation window M.</param>
/// <param name="Length">Length of the series (steps).</param>
/// <param name="WindowReached">False when no M &lt; n satisfied M ≥ c·τ(M): the chain is too short and τ is a lower bound.</param>
public sealed record IntegratedTimeEstimate(double Tau, int Window, int Length, bool WindowReached)
{
    /// <summary>Chain length in units of τ (n/τ); the usual requirement is ≥ 50.</summary>
    public double LengthInTau => Length / Tau;
}

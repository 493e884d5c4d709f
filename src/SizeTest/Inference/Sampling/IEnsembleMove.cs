namespace SizeTest.Inference.Sampling;

/// <summary>
/// A proposal strategy for the ensemble sampler. The sampler splits the walkers into two
/// halves and updates one half at a time with positions proposed from the other half (the
/// complementary ensemble), so that the update keeps detailed balance for every walker
/// (Goodman &amp; Weare 2010, CAMCoS 5, 65, §3). A move only proposes; the sampler evaluates the
/// log density (possibly in parallel) and accepts with probability
/// min(1, exp(logFactor + ln p(Y) − ln p(X))).
/// </summary>
/// <remarks>
/// Implementations must draw every random number they need from <c>rng</c> sequentially
/// inside <see cref="Propose"/>; that is what makes a run reproducible for a seed whatever
/// the number of threads used for evaluation. Implementations must not keep per-run state
/// that depends on evaluation order.
/// </remarks>
public interface IEnsembleMove
{
    /// <summary>Short name for logs and the run manifest (e.g. <c>stretch</c>).</summary>
    string Name { get; }

    /// <summary>
    /// Proposes new positions for the walkers listed in <paramref name="active"/>.
    /// </summary>
    /// <param name="positions">All walker positions, walker-major: walker w, parameter p at <c>w·dimension + p</c>. Read only.</param>
    /// <param name="dimension">Number of parameters d.</param>
    /// <param name="active">Indices of the walkers being updated.</param>
    /// <param name="complement">Indices of the walkers held fixed; proposals may use only these and the active walker itself.</param>
    /// <param name="rng">The sampler's random source.</param>
    /// <param name="proposals">Output: the proposal for <c>active[i]</c> at <c>i·dimension … i·dimension + d − 1</c>.</param>
    /// <param name="logFactors">Output: for <c>active[i]</c>, the log of the proposal-asymmetry factor added to the Metropolis–Hastings log ratio (for the stretch move (d − 1) ln z).</param>
    void Propose(ReadOnlySpan<double> positions, int dimension, ReadOnlySpan<int> active, ReadOnlySpan<int> complement,
                 Random rng, Span<double> proposals, Span<double> logFactors);
}

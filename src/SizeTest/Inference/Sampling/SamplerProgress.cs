namespace SizeTest.Inference.Sampling;

/// <summary>Progress of an ensemble-sampler run, reported through <see cref="IProgress{T}"/>.</summary>
/// <param name="Step">Steps completed.</param>
/// <param name="TotalSteps">Steps requested.</param>
/// <param name="AcceptanceFraction">Mean acceptance fraction over walkers so far.</param>
/// <param name="Elapsed">Wall time since the run started.</param>
public sealed record SamplerProgress(int Step, int TotalSteps, double AcceptanceFraction, TimeSpan Elapsed)
{
    /// <summary>Fraction done, 0 … 1.</summary>
    public double Fraction => TotalSteps == 0 ? 1.0 : (double)Step / TotalSteps;

    /// <summary>Largest integrated autocorrelation time at the last convergence check (steps), or null before the first.</summary>
    public double? Tau { get; init; }
}

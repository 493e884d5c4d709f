namespace SizeTest.Inference.Sampling;

/// <summary>
/// Thresholds of the convergence verdict of a sampled posterior. A run is reported as
/// converged only when every check passes for every parameter.
/// </summary>
public sealed record ConvergenceCriteria
{
    /// <summary>
    /// Minimum chain length (steps after burn-in) in units of the integrated autocorrelation
    /// time τ. Default 50: below that τ itself is not reliable (common practice for ensemble
    /// samplers; Sokal 1997 §3 asks for n ≫ τ).
    /// </summary>
    public double MinLengthInTau { get; init; } = 50.0;

    /// <summary>Largest acceptable rank-normalised split-R̂. Default 1.01 (Vehtari et al. 2021 §4).</summary>
    public double MaxRhat { get; init; } = 1.01;

    /// <summary>
    /// Smallest acceptable effective sample size (bulk, tail, and walkers·steps/τ). Default 400
    /// (Vehtari et al. 2021 §4 recommend ≥ 100 per chain for 4 chains, i.e. 400 in total).
    /// </summary>
    public double MinEss { get; init; } = 400.0;

    /// <summary>Smallest acceptable mean acceptance fraction. Default 0.1 (rule of thumb: 0.2–0.5 is healthy for the stretch move).</summary>
    public double MinAcceptance { get; init; } = 0.1;

    /// <summary>Largest acceptable mean acceptance fraction. Default 0.9 (near 1 the walkers barely move relative to each other).</summary>
    public double MaxAcceptance { get; init; } = 0.9;

    /// <summary>
    /// Number of walker groups R̂ compares (default 4). The walkers of an ensemble are not
    /// independent chains and each one alone is short in units of τ (a split half of one walker
    /// has only n/(2τ) effective draws, which inflates R̂ by about τ/n even for a perfectly mixed
    /// run), so R̂ is computed on this many groups of walkers (contiguous blocks, interleaved
    /// step by step), each split in its first and second half in time. Walkers stuck in
    /// different regions still show up as disagreeing groups.
    /// </summary>
    public int RhatGroups { get; init; } = 4;

    /// <summary>Sokal window constant c used for τ. Default 5.</summary>
    public double WindowConstant { get; init; } = Autocorrelation.DefaultWindowConstant;
}

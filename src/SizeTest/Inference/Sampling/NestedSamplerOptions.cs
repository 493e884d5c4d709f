namespace SizeTest.Inference.Sampling;

/// <summary>Settings of a nested-sampling run. All fields have working defaults.</summary>
public sealed record NestedSamplerOptions
{
    /// <summary>Number of live points N (default 400). σ(ln Z) falls as 1/√N.</summary>
    public int LivePoints { get; init; } = 400;

    /// <summary>Seed of the sampler's own <see cref="Random"/>. Default 1.</summary>
    public int Seed { get; init; } = 1;

    /// <summary>
    /// Stop when the evidence still held by the live points, estimated as L_max,live · X_i, would
    /// change ln Z by less than this: ln(Z + L_max X_i) − ln Z &lt; Tolerance. Default 0.01.
    /// </summary>
    public double Tolerance { get; init; } = 0.01;

    /// <summary>
    /// Slice-sampling steps per replacement (each along a random direction shaped by the live
    /// points' covariance). Null (default) for max(5, 3·d).
    /// </summary>
    public int? SliceSteps { get; init; }

    /// <summary>Hard limit on iterations (dead points); reaching it gives a not-converged result. Default 1 000 000.</summary>
    public int MaxIterations { get; init; } = 1_000_000;

    /// <summary>Parameter names for error messages; null for <c>theta_0</c>, ….</summary>
    public IReadOnlyList<string>? ParameterNames { get; init; }
}

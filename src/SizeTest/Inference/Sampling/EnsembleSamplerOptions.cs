namespace SizeTest.Inference.Sampling;

/// <summary>Settings of one ensemble-sampler run. All fields have working defaults.</summary>
public sealed record EnsembleSamplerOptions
{
    /// <summary>Number of walkers (at least 2 × the dimension; Goodman &amp; Weare 2010 §3). Default 32.</summary>
    public int Walkers { get; init; } = 32;

    /// <summary>Number of ensemble steps (each step updates every walker once). Default 3000.</summary>
    public int Steps { get; init; } = 3000;

    /// <summary>
    /// When set, a run whose verdict is negative after <see cref="Steps"/> steps is extended (same
    /// random stream, so still deterministic) until it converges or reaches this many steps: each
    /// extension aims at 1.1 × <see cref="ConvergenceCriteria.MinLengthInTau"/> · τ after the burn-in
    /// and adds at least half the steps run so far. Null (default): run exactly <see cref="Steps"/>.
    /// </summary>
    public int? MaxSteps { get; init; }

    /// <summary>Seed of the sampler's own <see cref="Random"/>. Default 1.</summary>
    public int Seed { get; init; } = 1;

    /// <summary>
    /// Steps discarded at the start before samples and diagnostics are computed. Null (default)
    /// discards the first quarter of the run (of the extended run when <see cref="MaxSteps"/>
    /// extends it). The full chain is still kept in the run's store.
    /// </summary>
    public int? BurnIn { get; init; }

    /// <summary>Keep every <c>Thin</c>-th step in the flat samples (diagnostics use every step). Default 1.</summary>
    public int Thin { get; init; } = 1;

    /// <summary>
    /// Threads used to evaluate one half-ensemble of proposals: −1 (default) for all cores,
    /// 1 for serial evaluation. Results for a seed do not depend on this value.
    /// </summary>
    public int MaxDegreeOfParallelism { get; init; } = -1;

    /// <summary>The proposal strategy. Default the stretch move with a = 2.</summary>
    public IEnsembleMove Move { get; init; } = new StretchMove();

    /// <summary>Thresholds of the convergence verdict.</summary>
    public ConvergenceCriteria Criteria { get; init; } = new();

    /// <summary>Parameter names for stores and verdict messages; null for <c>theta_0</c>, <c>theta_1</c>, ….</summary>
    public IReadOnlyList<string>? ParameterNames { get; init; }

    /// <summary>Burn-in used for a run of exactly <see cref="Steps"/> steps (see <see cref="EnsembleRun.BurnIn"/> for the one a run used).</summary>
    public int EffectiveBurnIn => BurnIn ?? Steps / 4;
}

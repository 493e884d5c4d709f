using SizeTest.Inference.Comparison;

namespace SizeTest.Inference;

/// <summary>The settings a study ran with (recorded in results.json for reproducibility).</summary>
/// <param name="Observable">The observable fitted (written <c>size</c>, <c>sb</c> or <c>joint</c>).</param>
/// <param name="Selection">Selection cuts.</param>
/// <param name="SizeSbRelation">Whether the joint model links μ to physical size.</param>
/// <param name="PivotSizeKpc">Pivot of that relation, kpc.</param>
/// <param name="DimmingExponentOffset">Offset added to each model's bolometric dimming exponent.</param>
/// <param name="GridNodes">Redshift-grid nodes.</param>
/// <param name="Starts">Optimiser starts per model.</param>
/// <param name="Bootstrap">Bootstrap resamples (0: none).</param>
/// <param name="CrossValidationFolds">Folds (0: none).</param>
/// <param name="Sampler">The posterior sampler (written <c>none</c>, <c>mcmc</c> or <c>nested</c>).</param>
/// <param name="Walkers">MCMC walkers (when sampled).</param>
/// <param name="Steps">MCMC steps (when sampled).</param>
/// <param name="LivePoints">Nested-sampling live points (when sampled).</param>
/// <param name="ProfileParameter">Profiled parameter, if any.</param>
/// <param name="Expected">Expected ranges given by the user.</param>
/// <param name="Seed">Seed of every random process in the study.</param>
/// <param name="Survey">The survey terms (size relation, groups, binned evolution, photometric redshifts, size errors, luminosity
/// window), or null when none was active.</param>
/// <param name="CompactRadioSources">The sample is of compact radio sources (it carries radio flux densities): the shipped
/// expectations for galaxy size and SB evolution are not applied (<see cref="Comparison.EvolutionExpectation.InForce"/>).</param>
public sealed record FitSettings(
    ObservableKind Observable, SelectionLimits Selection, bool SizeSbRelation, double PivotSizeKpc, double DimmingExponentOffset,
    int GridNodes, int Starts, int Bootstrap, int CrossValidationFolds, SamplerKind Sampler, int Walkers, int Steps, int LivePoints, string? ProfileParameter,
    IReadOnlyList<ExpectedRange> Expected, int Seed, Survey.SurveySettings? Survey = null, bool CompactRadioSources = false);

/// <summary>
/// Everything a fit study produced: sample counts, the ranked models (the <c>models</c> array of results.json), Bayes
/// factors, likelihood-ratio tests, required evolution, bootstrap, cross-validation, profile, notes and settings.
/// Serialised by <see cref="ResultsJson"/>; consumed by reporting.
/// </summary>
public sealed record FitResult
{
    /// <summary>Version of the results.json layout.</summary>
    public int SchemaVersion { get; init; } = 1;
    /// <summary>
    /// The study's answer (best model or null, decided, Kass–Raftery strength, reason), computed from the fields below
    /// by <see cref="Comparison.StudyVerdict.From"/>; written to results.json, not read back.
    /// </summary>
    public Comparison.StudyVerdict Verdict => Comparison.StudyVerdict.From(this);
    /// <summary>Catalogue file or mock name.</summary>
    public required string Source { get; init; }
    /// <summary>Rows read from the catalogue (= accepted + rejected).</summary>
    public required long RowsRead { get; init; }
    /// <summary>Rows accepted into the sample.</summary>
    public required long Accepted { get; init; }
    /// <summary>Rows rejected (see the reject log).</summary>
    public required long Rejected { get; init; }
    /// <summary>Seed of the study.</summary>
    public required int Seed { get; init; }
    /// <summary>Settings.</summary>
    public required FitSettings Settings { get; init; }
    /// <summary>Models ranked by BIC, with ΔAIC/ΔBIC/weights filled.</summary>
    public required IReadOnlyList<ModelFitSummary> Models { get; init; }
    /// <summary>Bayes factors of the best model over each other.</summary>
    public IReadOnlyList<BayesFactor> BayesFactors { get; init; } = [];
    /// <summary>Nested-pair tests (evolution free vs fixed at 0).</summary>
    public IReadOnlyList<LikelihoodRatioTest> LikelihoodRatioTests { get; init; } = [];
    /// <summary>Evolution each model needs.</summary>
    public IReadOnlyList<RequiredEvolution> RequiredEvolution { get; init; } = [];
    /// <summary>Bootstrap intervals per model, when run.</summary>
    public IReadOnlyList<BootstrapResult> Bootstrap { get; init; } = [];
    /// <summary>Cross-validated log predictive densities, when run.</summary>
    public IReadOnlyList<CrossValidationResult> CrossValidation { get; init; } = [];
    /// <summary>Paired differences of cross-validated ln p from the best-scoring model (same folds for every model).</summary>
    public IReadOnlyList<CrossValidationDifference> CrossValidationDifferences { get; init; } = [];
    /// <summary>Profile likelihoods, when requested.</summary>
    public IReadOnlyList<ProfileLikelihoodResult> Profiles { get; init; } = [];
    /// <summary>Caveats (degeneracies, conventions) for the reader.</summary>
    public IReadOnlyList<string> Notes { get; init; } = [];
    /// <summary>One entry per model sampled by ensemble MCMC: chain length, burn-in and convergence numbers.</summary>
    public IReadOnlyList<ChainSummary> Chains { get; init; } = [];
    /// <summary>Posterior samples for writing next to results.json (not serialised into it).</summary>
    [System.Text.Json.Serialization.JsonIgnore]
    public IReadOnlyList<PosteriorDraws> Samples { get; init; } = [];
    /// <summary>True when every model's fit converged.</summary>
    public bool AllConverged => Models.All(m => m.Converged);
}

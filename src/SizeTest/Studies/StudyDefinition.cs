using SizeTest.Catalogues;
using SizeTest.Inference;
using SizeTest.Photometry;

namespace SizeTest.Studies;

/// <summary>
/// A parsed study file: everything one run needs, from the catalogue to the report. Built by
/// <see cref="StudyFileParser"/>; run by <see cref="StudyRunner"/>. Paths are already resolved against the
/// study file's folder.
/// </summary>
public sealed record StudyDefinition
{
    /// <summary>Study name (the default output folder is <c>reports/NAME/</c>).</summary>
    public required string Name { get; init; }
    /// <summary>Study file path as given, or empty for a study built in code.</summary>
    public string StudyFilePath { get; init; } = "";
    /// <summary>Study file text verbatim (for the run manifest), or empty.</summary>
    public string StudyFileText { get; init; } = "";
    /// <summary>Folder that relative paths in the study (correction tables) are resolved against: the study file's folder.</summary>
    public string BaseDirectory { get; init; } = ".";
    /// <summary>Catalogue file, resolved against the study file's folder.</summary>
    public required string CataloguePath { get; init; }
    /// <summary>Reader options (format, table/HDU).</summary>
    public ReaderOptions Reader { get; init; } = new();
    /// <summary>Column mapping (the <c>[columns]</c> table and the size definition).</summary>
    public ColumnMapping Mapping { get; init; } = ColumnMapping.Detect;
    /// <summary>Whether the catalogue is synthetic (the report says so).</summary>
    public bool Synthetic { get; init; }
    /// <summary>Photometric corrections as option strings (parsed when the study runs, so tables are read then).</summary>
    public PhotometryOptionText Corrections { get; init; } = new();
    /// <summary>World-model names (see <see cref="Cosmology.WorldModels"/>).</summary>
    public required IReadOnlyList<string> Models { get; init; }
    /// <summary>The nuisance model shared by every hypothesis (observable, selection, conventions).</summary>
    public required NuisanceModel Nuisance { get; init; }

    /// <summary>Largest fraction of objects that may lie outside the stated cuts (<c>selection.max_outside_fraction</c>); see <see cref="SelectionConsistency"/>.</summary>
    public double MaxOutsideSelection { get; init; } = SelectionConsistency.DefaultMaxOutsideFraction;
    /// <summary>Parameter settings for every model that has the parameter.</summary>
    public IReadOnlyList<StudyParameter> Parameters { get; init; } = [];
    /// <summary>The flux convention of every static model (<c>models.flux_convention</c>; it fixes their
    /// <c>luminosity_exponent</c>), or null for the models' own setting (default energy-loss).</summary>
    public Cosmology.FluxConvention? FluxConvention { get; init; }
    /// <summary>Per-model parameter settings (by world-model name), applied after <see cref="Parameters"/>.</summary>
    public IReadOnlyDictionary<string, IReadOnlyList<StudyParameter>> ModelParameters { get; init; } = new Dictionary<string, IReadOnlyList<StudyParameter>>();
    /// <summary>Expected ranges of evolution parameters.</summary>
    public IReadOnlyList<ExpectedRange> Expected { get; init; } = [];
    /// <summary>Seed of every random process.</summary>
    public int Seed { get; init; } = 1;
    /// <summary>Optimiser starts per model.</summary>
    public int Starts { get; init; } = 4;
    /// <summary>Bootstrap resamples per model (0: none).</summary>
    public int Bootstrap { get; init; }
    /// <summary>Cross-validation folds (0: none).</summary>
    public int CrossValidationFolds { get; init; }
    /// <summary>Sampler after each fit: <c>none</c> or <c>mcmc</c> (affine-invariant ensemble; every model is sampled
    /// once, and the best-ranked model's chain is the one plotted).</summary>
    public SamplerKind Sampler { get; init; } = SamplerKind.None;
    /// <summary>Ensemble steps per walker when <see cref="Sampler"/> is <c>mcmc</c>; 0 (<c>sampler_steps = "auto"</c>, the
    /// default): run to convergence, at most <see cref="SamplerMaxSteps"/>.</summary>
    public int SamplerSteps { get; init; }
    /// <summary>The most steps per walker of a run to convergence.</summary>
    public int SamplerMaxSteps { get; init; } = Inference.Sampling.ChainMemory.DefaultMaxSteps;
    /// <summary>Ensemble walkers.</summary>
    public int SamplerWalkers { get; init; } = 32;
    /// <summary>A saved power analysis (power.json of <c>sizetest power</c>) to show as the power curve, or null.</summary>
    public string? PowerResultPath { get; init; }
    /// <summary>Report options.</summary>
    public StudyReportOptions Report { get; init; } = new();
    /// <summary>Survey terms of the <c>[survey]</c> table (size–luminosity/mass relation, groups, binned evolution,
    /// photometric redshifts, size-error model, luminosity window), or null when the table is absent.</summary>
    public Inference.Survey.SurveyRequest? Survey { get; init; }
    /// <summary>How the photometry stage derives luminosities or masses for the survey terms, or null.</summary>
    public Photometry.LuminosityOption? Luminosity { get; init; }
}

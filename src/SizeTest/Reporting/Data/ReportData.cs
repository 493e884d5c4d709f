namespace SizeTest.Reporting.Data;

/// <summary>
/// Everything a report shows, as plain data: filled by an adapter from the study result (or by
/// tests from synthetic numbers). Reporting never refits: model curves, criteria and intervals
/// arrive here already computed; the report only draws, tabulates and words them.
/// </summary>
public sealed record ReportData
{
    /// <summary>What was run: study name, versions, seed.</summary>
    public required JobSummary Job { get; init; }

    /// <summary>Rows read, accepted and rejected, with reject reasons.</summary>
    public required DataSummary Data { get; init; }

    /// <summary>The accepted objects (redshift, angular size, surface brightness).</summary>
    // The report-data.json key stays "sample" (format version 1).
    [System.Text.Json.Serialization.JsonPropertyName("sample")]
    public required ObjectPoints Objects { get; init; }

    /// <summary>Per fitted model: its fit summary, curves and required evolution. Order is display order.</summary>
    public required IReadOnlyList<ModelReport> Models { get; init; }

    /// <summary>The assumptions every conclusion rests on (cosmology priors, evolution form, selection model, K-corrections).</summary>
    public required IReadOnlyList<Assumption> Assumptions { get; init; }

    /// <summary>Binned angular-size medians (arcsec) with bootstrap intervals, or null.</summary>
    public IReadOnlyList<BinnedValue>? ThetaBins { get; init; }

    /// <summary>Binned surface-brightness means (mag/arcsec²) with bootstrap intervals, or null.</summary>
    public IReadOnlyList<BinnedValue>? MuBins { get; init; }

    /// <summary>
    /// Surface brightness at z → 0 (mag/arcsec²) that anchors the (1+z)^4 and (1+z)^1 dimming
    /// curves; null anchors them at the lowest-redshift bin of <see cref="MuBins"/>.
    /// </summary>
    public double? SurfaceBrightnessZeroPoint { get; init; }

    /// <summary>Posterior samples for a corner plot, when the study sampled.</summary>
    public CornerDraws? Posterior { get; init; }

    /// <summary>Power curve from mock catalogues, when the study ran a power analysis.</summary>
    public PowerCurve? Power { get; init; }

    /// <summary>Extra conclusions in words, added after the ones the report derives from the criteria.</summary>
    public IReadOnlyList<string> ExtraConclusions { get; init; } = [];

    /// <summary>
    /// A copy with <see cref="ThetaBins"/> (medians) and <see cref="MuBins"/> (means) computed
    /// from <see cref="Objects"/> in <paramref name="bins"/> equal-count redshift bins with
    /// <paramref name="resamples"/> bootstrap resamples seeded by <paramref name="seed"/>
    /// (see <see cref="BinnedStatistics"/>).
    /// </summary>
    public ReportData WithBins(int bins = 8, int resamples = 200, int seed = 0)
    {
        var edges = BinnedStatistics.EqualCountEdges(Objects.Z, bins);
        if (edges.Length < 2) return this;
        return this with
        {
            ThetaBins = Objects.ThetaArcsec is { } th ? BinnedStatistics.Compute(Objects.Z, th, edges, BinnedStatistics.Statistic.Median, resamples, seed) : null,
            MuBins = Objects.Mu is { } mu ? BinnedStatistics.Compute(Objects.Z, mu, edges, BinnedStatistics.Statistic.Mean, resamples, seed + 1) : null,
        };
    }

    /// <summary>The study's verdict (results.json <c>verdict</c>), or null when the data came without one.</summary>
    public Inference.Comparison.StudyVerdict? Verdict { get; init; }

    /// <summary>The one table of evolution tests every "needs evolution" statement comes from.</summary>
    public IReadOnlyList<Inference.Comparison.EvolutionTestRow> EvolutionTests { get; init; } = [];

    /// <summary>"Can the data decide?" sentences (a block that cannot discriminate, a ranking within noise, convergence).</summary>
    public IReadOnlyList<string> DecisionLines { get; init; } = [];

    /// <summary>The selection's surface-brightness limit μ_lim (mag/arcsec²), drawn on the Tolman figure, or null.</summary>
    public double? SurfaceBrightnessLimit { get; init; }

    /// <summary>Bootstrap percentile intervals per model (results.json <c>bootstrap</c>), when the study ran a bootstrap.</summary>
    public IReadOnlyList<Inference.BootstrapResult> Bootstrap { get; init; } = [];

    /// <summary>Cross-validated log predictive densities per model (results.json <c>cross_validation</c>), when the study ran them.</summary>
    public IReadOnlyList<Inference.CrossValidationResult> CrossValidation { get; init; } = [];

    /// <summary>Paired cross-validation differences from the best-scoring model (results.json <c>cross_validation_differences</c>).</summary>
    public IReadOnlyList<Inference.Comparison.CrossValidationDifference> CrossValidationDifferences { get; init; } = [];

    /// <summary>The run manifest shown at the end of the report (may be null before it is known).</summary>
    public Pack.RunManifest? Manifest { get; init; }
}

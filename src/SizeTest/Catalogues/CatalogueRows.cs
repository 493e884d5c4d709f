namespace SizeTest.Catalogues;

/// <summary>
/// A validated catalogue in normalised units, one array per role (column-oriented so the
/// likelihood can run over slices). Angles are radians, surface brightness mag/arcsec²,
/// magnitudes mag. Optional roles are null when the catalogue lacks them; within a present
/// role every entry is finite (errors may be NaN only where the role is absent per row —
/// they are not: rows missing a required value are rejected into the reject log).
/// </summary>
public sealed class CatalogueRows
{
    /// <summary>Builds a sample; all present arrays must have length <see cref="Count"/>.</summary>
    public CatalogueRows(
        string sourceName,
        RowNumbers sourceRows,
        double[] z,
        string[]? id = null,
        double[]? zErr = null,
        double[]? thetaRad = null,
        double[]? thetaErrRad = null,
        double[]? mu = null,
        double[]? muErr = null,
        double[]? mag = null,
        double[]? magErr = null,
        string[]? band = null,
        SizeDefinition? sizeDefinition = null,
        IReadOnlyDictionary<string, double[]>? extraColumns = null,
        SurveyColumns? survey = null)
    {
        Count = z.Length;
        SourceName = sourceName;
        ArgumentNullException.ThrowIfNull(sourceRows);
        if (sourceRows.Length != Count) throw new ArgumentException($"sourceRows has {sourceRows.Length} entries, expected {Count}");
        SourceRows = sourceRows;
        Z = z;
        Id = Check(id, nameof(id));
        ZErr = Check(zErr, nameof(zErr));
        ThetaRad = Check(thetaRad, nameof(thetaRad));
        ThetaErrRad = Check(thetaErrRad, nameof(thetaErrRad));
        Mu = Check(mu, nameof(mu));
        MuErr = Check(muErr, nameof(muErr));
        Mag = Check(mag, nameof(mag));
        MagErr = Check(magErr, nameof(magErr));
        Band = Check(band, nameof(band));
        SizeDefinition = sizeDefinition ?? SizeDefinition.Effective;
        ExtraColumns = extraColumns ?? new Dictionary<string, double[]>();
        Survey = survey ?? SurveyColumns.None;
        Check(Survey.AbsMag, "abs_mag"); Check(Survey.LogMass, "log_mass"); Check(Survey.FluxDensityJy, "flux_density");
        Check(Survey.SersicN, "sersic_n"); Check(Survey.Group, "group"); Check(Survey.Weight, "weight");
        foreach (var (name, col) in ExtraColumns)
            if (col.Length != Count) throw new ArgumentException($"extra column '{name}' has {col.Length} entries, expected {Count}");
    }

    private T[]? Check<T>(T[]? a, string name) =>
        a is null || a.Length == Count ? a : throw new ArgumentException($"{name} has {a.Length} entries, expected {Count}");

    /// <summary>Number of accepted objects.</summary>
    public int Count { get; }

    /// <summary>File (or mock) the sample came from, for messages and the manifest.</summary>
    public string SourceName { get; }

    /// <summary>
    /// For each object, its 1-based line (CSV) or row (FITS, VOTable) in the source, stored
    /// compactly as runs (index it like an array; a <c>long[]</c> converts implicitly).
    /// </summary>
    public RowNumbers SourceRows { get; }

    /// <summary>Object identifiers, if the catalogue had them.</summary>
    public string[]? Id { get; }

    /// <summary>Redshift (required, &gt; 0).</summary>
    public double[] Z { get; }

    /// <summary>Redshift error (1σ), if present.</summary>
    public double[]? ZErr { get; }

    /// <summary>Angular size in radians (&gt; 0), if present.</summary>
    public double[]? ThetaRad { get; }

    /// <summary>Angular-size error (1σ) in radians, if present.</summary>
    public double[]? ThetaErrRad { get; }

    /// <summary>Surface brightness in mag/arcsec² (AB unless the photometry stage says otherwise), if present.</summary>
    public double[]? Mu { get; }

    /// <summary>Surface-brightness error (1σ) in mag/arcsec², if present.</summary>
    public double[]? MuErr { get; }

    /// <summary>Total magnitude, if present.</summary>
    public double[]? Mag { get; }

    /// <summary>Magnitude error (1σ), if present.</summary>
    public double[]? MagErr { get; }

    /// <summary>Band name per object, if present.</summary>
    public string[]? Band { get; }

    /// <summary>How the size was measured.</summary>
    public SizeDefinition SizeDefinition { get; }

    /// <summary>The survey roles (absolute magnitude, stellar mass, flux density, Sérsic index, group, weight); absent ones null.</summary>
    public SurveyColumns Survey { get; }

    /// <summary>Further numeric columns kept by name (e.g. per-object K-correction, extinction).</summary>
    public IReadOnlyDictionary<string, double[]> ExtraColumns { get; }

    /// <summary>
    /// The same objects with only their file rows and redshifts (the other columns dropped), for a caller that has turned
    /// the columns into observables and needs the rows only to name them: a 10⁶-row catalogue's ids and column arrays
    /// (~100 MB) can then be collected before the fit.
    /// </summary>
    public CatalogueRows RowsOnly() => new(SourceName, SourceRows, Z, sizeDefinition: SizeDefinition);

    /// <summary>The objects at <paramref name="rows"/> (ascending indices), every role kept.</summary>
    public CatalogueRows Take(IReadOnlyList<int> rows)
    {
        ArgumentNullException.ThrowIfNull(rows);
        T[]? Pick<T>(T[]? a) => a is null ? null : rows.Select(i => a[i]).ToArray();
        var source = RowNumbers.FromArray(rows.Select(i => SourceRows[i]).ToArray());
        return new CatalogueRows(SourceName, source, Pick(Z)!, Pick(Id), Pick(ZErr), Pick(ThetaRad), Pick(ThetaErrRad), Pick(Mu), Pick(MuErr),
            Pick(Mag), Pick(MagErr), Pick(Band), SizeDefinition, ExtraColumns.ToDictionary(kv => kv.Key, kv => Pick(kv.Value)!),
            new SurveyColumns(Pick(Survey.AbsMag), Pick(Survey.LogMass), Pick(Survey.FluxDensityJy), Pick(Survey.SersicN), Pick(Survey.Group), Pick(Survey.Weight)));
    }
}

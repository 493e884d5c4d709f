
using SizeTest.Foundation.Angles;

namespace SizeTest.Catalogues;

/// <summary>
/// The result of loading a catalogue: the validated <see cref="CatalogueRows"/>, the reject log, the
/// mapping used and why, and what the file looked like. Always <c>RowsRead = Accepted + Rejected</c>.
/// </summary>
public sealed class CatalogueLoad
{
    internal CatalogueLoad(CatalogueRows sample, RejectLog rejectLog, ResolvedMapping mapping, CatalogueFormat format, string? table,
        IReadOnlyList<CatalogueColumn> columns, IReadOnlyList<string> layoutNotes, long rowsRead, IReadOnlyDictionary<ColumnRole, long> nullCounts)
    {
        Rows = sample;
        RejectLog = rejectLog;
        Mapping = mapping;
        Format = format;
        Table = table;
        Columns = columns;
        LayoutNotes = layoutNotes;
        RowsRead = rowsRead;
        NullCounts = nullCounts;
        if (rowsRead != Accepted + Rejected) throw new InvalidOperationException($"row accounting broken: {rowsRead} read, {Accepted} accepted, {Rejected} rejected");
    }

    /// <summary>
    /// The same load with the accepted objects at <paramref name="keep"/> (ascending indices) kept and the others
    /// moved to the reject log with <paramref name="rejected"/> (one entry per object removed, any order).
    /// <c>RowsRead = Accepted + Rejected</c> still holds.
    /// </summary>
    public CatalogueLoad WithRejected(IReadOnlyList<int> keep, IReadOnlyList<RejectEntry> rejected)
    {
        ArgumentNullException.ThrowIfNull(keep);
        ArgumentNullException.ThrowIfNull(rejected);
        if (keep.Count + rejected.Count != Rows.Count)
            throw new ArgumentException($"{keep.Count} kept and {rejected.Count} rejected do not add up to {Rows.Count} accepted objects");
        var log = new RejectLog(RejectLog.SourceName);
        foreach (var e in RejectLog.Entries.Concat(rejected).OrderBy(e => e.Row)) log.Add(e);
        return new CatalogueLoad(Rows.Take(keep), log, Mapping, Format, Table, Columns, LayoutNotes, RowsRead, NullCounts) { PopulationLabels = PopulationLabels };
    }

    /// <summary>
    /// Columns that look like population labels with a few well-filled labels (counted over the accepted rows as loaded), when
    /// the group column was not given: each could be fitted as separate populations (<see cref="PopulationLabelColumn.Note"/>).
    /// </summary>
    public IReadOnlyList<PopulationLabelColumn> PopulationLabels { get; init; } = [];

    /// <summary>The accepted objects in normalised units.</summary>
    public CatalogueRows Rows { get; }

    /// <summary>The rejected rows with reasons.</summary>
    public RejectLog RejectLog { get; }

    /// <summary>The mapping used.</summary>
    public ResolvedMapping Mapping { get; }

    /// <summary>The detection report: one <c>role ← column (because …)</c> line per role, then size definition, kept columns and
    /// notes, then the population-label notes (<see cref="PopulationLabels"/>).</summary>
    public IReadOnlyList<string> DetectionReport => [.. Mapping.ReportLines(), .. PopulationLabels.Select(p => p.Note)];

    /// <summary>The file format.</summary>
    public CatalogueFormat Format { get; }

    /// <summary>The table read (FITS HDU, VOTable TABLE), or null for text.</summary>
    public string? Table { get; }

    /// <summary>The file's columns.</summary>
    public IReadOnlyList<CatalogueColumn> Columns { get; }

    /// <summary>Layout facts (delimiter, header line, tables in the file).</summary>
    public IReadOnlyList<string> LayoutNotes { get; }

    /// <summary>Data rows read.</summary>
    public long RowsRead { get; }

    /// <summary>Rows accepted into the sample.</summary>
    public int Accepted => Rows.Count;

    /// <summary>Rows rejected (each is in <see cref="RejectLog"/>).</summary>
    public int Rejected => RejectLog.Count;

    /// <summary>Null cells per mapped role among the accepted rows.</summary>
    public IReadOnlyDictionary<ColumnRole, long> NullCounts { get; }

    /// <summary>Per-role statistics over the accepted rows (angles in arcsec).</summary>
    public IReadOnlyList<RoleStatistics> Statistics()
    {
        var list = new List<RoleStatistics>();
        foreach (var role in ColumnRoles.All)
        {
            if (!Mapping.Roles.TryGetValue(role, out var b)) continue;
            double[]? values = role switch
            {
                ColumnRole.Z => Rows.Z,
                ColumnRole.ZErr => Rows.ZErr,
                ColumnRole.Theta => Rows.ThetaRad,
                ColumnRole.ThetaErr => Rows.ThetaErrRad,
                ColumnRole.Mu => Rows.Mu,
                ColumnRole.MuErr => Rows.MuErr,
                ColumnRole.Mag => Rows.Mag,
                ColumnRole.MagErr => Rows.MagErr,
                ColumnRole.AbsMag => Rows.Survey.AbsMag,
                ColumnRole.LogMass => Rows.Survey.LogMass,
                ColumnRole.FluxDensity => Rows.Survey.FluxDensityJy,
                ColumnRole.SersicN => Rows.Survey.SersicN,
                ColumnRole.Weight => Rows.Survey.Weight,
                _ => null,
            };
            double scale = role is ColumnRole.Theta or ColumnRole.ThetaErr ? AngleUnits.ArcsecPerRadian : 1.0;
            string unit = role switch
            {
                ColumnRole.Theta or ColumnRole.ThetaErr => "arcsec",
                ColumnRole.Mu or ColumnRole.MuErr => "mag/arcsec2",
                ColumnRole.Mag or ColumnRole.MagErr or ColumnRole.AbsMag => "mag",
                ColumnRole.LogMass => "log(Msun)",
                ColumnRole.FluxDensity => "Jy",
                _ => "",
            };
            NullCounts.TryGetValue(role, out var nulls);
            if (values is null)
            {
                list.Add(new RoleStatistics(role, b.ColumnName, unit, Rows.Count, nulls, double.NaN, double.NaN, double.NaN));
                continue;
            }
            var sorted = values.Select(v => v * scale).ToArray();
            Array.Sort(sorted);
            int n = sorted.Length;
            double med = n == 0 ? double.NaN : n % 2 == 1 ? sorted[n / 2] : 0.5 * (sorted[n / 2 - 1] + sorted[n / 2]);
            list.Add(new RoleStatistics(role, b.ColumnName, unit, n, nulls, n == 0 ? double.NaN : sorted[0], med, n == 0 ? double.NaN : sorted[^1]));
        }
        return list;
    }
}

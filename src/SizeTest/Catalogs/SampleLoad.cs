using SizeTest.Common;

namespace SizeTest.Catalogs;

/// <summary>
/// The result of loading a catalogue: the validated <see cref="Sample"/>, the reject log, the
/// mapping used and why, and what the file looked like. Always <c>RowsRead = Accepted + Rejected</c>.
/// </summary>
public sealed class SampleLoad
{
    internal SampleLoad(Sample sample, RejectLog rejectLog, ResolvedMapping mapping, CatalogFormat format, string? table,
        IReadOnlyList<CatalogColumn> columns, IReadOnlyList<string> layoutNotes, long rowsRead, IReadOnlyDictionary<ColumnRole, long> nullCounts)
    {
        Sample = sample;
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

    /// <summary>The accepted objects in normalised units.</summary>
    public Sample Sample { get; }

    /// <summary>The rejected rows with reasons.</summary>
    public RejectLog RejectLog { get; }

    /// <summary>The mapping used.</summary>
    public ResolvedMapping Mapping { get; }

    /// <summary>The detection report: one <c>role ← column (because …)</c> line per role, then size definition, kept columns and notes.</summary>
    public IReadOnlyList<string> DetectionReport => Mapping.ReportLines();

    /// <summary>The file format.</summary>
    public CatalogFormat Format { get; }

    /// <summary>The table read (FITS HDU, VOTable TABLE), or null for text.</summary>
    public string? Table { get; }

    /// <summary>The file's columns.</summary>
    public IReadOnlyList<CatalogColumn> Columns { get; }

    /// <summary>Layout facts (delimiter, header line, tables in the file).</summary>
    public IReadOnlyList<string> LayoutNotes { get; }

    /// <summary>Data rows read.</summary>
    public long RowsRead { get; }

    /// <summary>Rows accepted into the sample.</summary>
    public int Accepted => Sample.Count;

    /// <summary>Rows rejected (each is in <see cref="RejectLog"/>).</summary>
    public int Rejected => RejectLog.Count;

    /// <summary>Null cells per mapped role among all rows read.</summary>
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
                ColumnRole.Z => Sample.Z,
                ColumnRole.ZErr => Sample.ZErr,
                ColumnRole.Theta => Sample.ThetaRad,
                ColumnRole.ThetaErr => Sample.ThetaErrRad,
                ColumnRole.Mu => Sample.Mu,
                ColumnRole.MuErr => Sample.MuErr,
                ColumnRole.Mag => Sample.Mag,
                ColumnRole.MagErr => Sample.MagErr,
                ColumnRole.AbsMag => Sample.Survey.AbsMag,
                ColumnRole.LogMass => Sample.Survey.LogMass,
                ColumnRole.FluxDensity => Sample.Survey.FluxDensityJy,
                ColumnRole.SersicN => Sample.Survey.SersicN,
                ColumnRole.Weight => Sample.Survey.Weight,
                _ => null,
            };
            double scale = role is ColumnRole.Theta or ColumnRole.ThetaErr ? Units.ArcsecPerRadian : 1.0;
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
                list.Add(new RoleStatistics(role, b.ColumnName, unit, Sample.Count, nulls, double.NaN, double.NaN, double.NaN));
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

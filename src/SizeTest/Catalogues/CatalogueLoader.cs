using System.Globalization;
using SizeTest.Foundation.Errors;

namespace SizeTest.Catalogues;

/// <summary>
/// The one call that turns a catalogue file into a validated <see cref="CatalogueRows"/>:
/// open the reader, resolve the column mapping, stream the mapped columns chunk by chunk,
/// accept or reject every row with a reason, and build the sample. Memory is proportional to
/// the accepted values of the mapped columns only; the raw table is never held.
/// </summary>
/// <remarks>
/// Validation rules (first fault in role order z, z_err, theta, theta_err, mu, mu_err, mag, mag_err,
/// id, band, abs_mag, log_mass, flux_density, sersic_n, group, weight, kept columns): a null cell → <see cref="RejectReason.MissingValue"/>; an undecodable
/// cell or a line with the wrong number of fields → <see cref="RejectReason.Unparsable"/>; z ≤ 0 →
/// <see cref="RejectReason.NonPositiveRedshift"/>; θ ≤ 0 → <see cref="RejectReason.NonPositiveSize"/>;
/// an error &lt; 0 → <see cref="RejectReason.NegativeError"/>; an infinite value, z above
/// <see cref="CatalogueLoadOptions.MaxRedshift"/>, θ ≥ π rad, |mag| or |μ| or their errors above
/// <see cref="CatalogueLoadOptions.MaxAbsMagnitude"/> → <see cref="RejectReason.OutOfRange"/>.
/// A file that cannot be read at all throws one <see cref="InputException"/>.
/// </remarks>
public static partial class CatalogueLoader
{
    private static readonly ColumnRole[] Order =
    [
        ColumnRole.Z, ColumnRole.ZErr, ColumnRole.Theta, ColumnRole.ThetaErr, ColumnRole.Mu, ColumnRole.MuErr,
        ColumnRole.Mag, ColumnRole.MagErr, ColumnRole.Id, ColumnRole.Band,
        ColumnRole.AbsMag, ColumnRole.LogMass, ColumnRole.FluxDensity, ColumnRole.SersicN, ColumnRole.Group, ColumnRole.Weight,
    ];

    /// <summary>Loads <paramref name="path"/> (see the type's remarks for the rules).</summary>
    public static CatalogueLoad Load(string path, CatalogueLoadOptions? options = null)
    {
        options ??= new CatalogueLoadOptions();
        using var reader = CatalogueReaders.Open(path, options.Reader);
        return Load(reader, options);
    }

    /// <summary>Loads from an open reader (for formats or sources opened elsewhere).</summary>
    public static CatalogueLoad Load(ICatalogueReader reader, CatalogueLoadOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(reader);
        options ??= new CatalogueLoadOptions();
        var source = reader.SourceName;
        var mapping = MappingResolver.Resolve(reader.Columns, options.Mapping, source);
        if (!mapping.Roles.ContainsKey(ColumnRole.Z))
        {
            // A column that would be the redshift but is taken by another role (e.g. --group z): say so, not "none found".
            var taken = mapping.Roles.Values.FirstOrDefault(b => b.Role != ColumnRole.Z && b.ColumnName.Length > 0 &&
                (b.ColumnName.Equals("z", StringComparison.OrdinalIgnoreCase) || b.ColumnName.Equals("redshift", StringComparison.OrdinalIgnoreCase)));
            if (taken is not null)
                throw SettingProblem.Input(
                    $"column '{taken.ColumnName}' is mapped to {taken.Role.Name()}, so it cannot also be the redshift, and no other redshift column was found; a column takes one role: map the redshift with {{col}} z=NAME or choose another column for {taken.Role.Name()}",
                    source);
            throw SettingProblem.Input(
                $"no redshift column found (none is named z/redshift/zspec… or has UCD src.redshift); map one with {{col}} z=NAME — the columns are {string.Join(", ", reader.Columns.Take(30).Select(c => $"'{c.Name}'"))}",
                source);
        }

        var bindings = Order.Where(mapping.Roles.ContainsKey).Select(r => mapping.Roles[r]).ToArray();
        // Columns that look like population labels, counted over the accepted rows for a note (the group column, when
        // detected, is counted from the sample; the others are read as text beside the mapped and kept columns).
        var labelCandidates = PopulationLabelColumns.Candidates(reader.Columns, mapping,
            options.Mapping.Assignments.Any(a => a.Role == ColumnRole.Group));
        int groupIndex = mapping.Roles.TryGetValue(ColumnRole.Group, out var groupBinding) ? groupBinding.ColumnIndex : -1;
        var labelTallies = labelCandidates.Select(c => new PopulationLabelColumns.Tally(reader.Columns[c.Index], c.Reason, reader.Columns[c.Index].Kind == ColumnKind.Real)).ToArray();
        var labelSlots = labelCandidates.Select(c => c.Index).Where(i => i != groupIndex).ToArray();
        var requests = bindings.Select(b => new ColumnRequest(b.ColumnIndex, b.Role.IsText()))
            .Concat(mapping.Kept.Select(k => new ColumnRequest(k.ColumnIndex, false)))
            .Concat(labelSlots.Select(i => new ColumnRequest(i, true))).ToList();

        long? hint = reader.RowCountHint;
        if (hint is > int.MaxValue) hint = int.MaxValue;
        var numeric = new ColumnBuilder<double>?[bindings.Length];
        var text = new ColumnBuilder<string>?[bindings.Length];
        for (int k = 0; k < bindings.Length; k++)
        {
            if (bindings[k].Role.IsText()) text[k] = new ColumnBuilder<string>(hint);
            else numeric[k] = new ColumnBuilder<double>(hint);
        }
        var kept = mapping.Kept.Select(_ => new ColumnBuilder<double>(hint)).ToArray();
        var rows = new RowNumbers.Builder();
        var rejects = new RejectLog(source);
        var nulls = bindings.ToDictionary(b => b.Role, _ => 0L);
        var nullCounts = new long[bindings.Length];
        var values = new double[bindings.Length];
        int thetaSlot = Array.FindIndex(bindings, b => b.Role == ColumnRole.Theta);
        int zSlot = Array.FindIndex(bindings, b => b.Role == ColumnRole.Z);
        long interval = Math.Max(1, options.ProgressInterval);
        long rowsRead = 0, nextProgress = interval, lastReported = -1;

        using var pipeline = new ChunkPipeline(reader, requests, Math.Max(1, options.ChunkRows));
        foreach (var chunk in pipeline.Chunks())
        {
            for (int r = 0; r < chunk.Count; r++)
            {
                rowsRead++;
                long pos = chunk.Positions[r];
                var reject = Check(chunk, r, bindings, mapping, values, thetaSlot, zSlot, options);
                if (reject is null)
                {
                    for (int k = 0; k < kept.Length; k++)
                    {
                        var buf = chunk.Columns[bindings.Length + k];
                        var name = mapping.Kept[k].Name;
                        if (buf.States[r] == CellState.Null) { reject = new RejectEntry(pos, name, "", RejectReason.MissingValue, "kept column has no value"); break; }
                        if (buf.States[r] == CellState.Invalid) { reject = new RejectEntry(pos, name, buf.InvalidText(r), RejectReason.Unparsable, NotANumber(buf.InvalidText(r))); break; }
                        if (!double.IsFinite(buf.Numbers![r])) { reject = new RejectEntry(pos, name, Fmt(buf.Numbers[r]), RejectReason.NonFinite, "not a finite number"); break; }
                    }
                }
                if (reject is not null) { rejects.Add(reject with { Row = pos }); continue; }
                // Null cells are counted among the accepted rows only: a rejected row's null is in the reject log
                // (issue 14 point 9: inspect counted the null z of a rejected row in the accepted rows' statistics).
                for (int k = 0; k < bindings.Length; k++)
                    if (chunk.Columns[k].States[r] == CellState.Null) nullCounts[k]++;
                rows.Add(pos);
                for (int k = 0; k < bindings.Length; k++)
                {
                    if (text[k] is { } tb) tb.Add(chunk.Columns[k].Texts![r]!);
                    else numeric[k]!.Add(values[k]);
                }
                for (int k = 0; k < kept.Length; k++) kept[k].Add(chunk.Columns[bindings.Length + k].Numbers![r]);
                for (int k = 0, slot = bindings.Length + kept.Length; k < labelCandidates.Count; k++)
                {
                    if (labelCandidates[k].Index == groupIndex) continue;
                    var buf = chunk.Columns[slot++];
                    labelTallies[k].Add(buf.States[r] == CellState.Value ? buf.Texts![r] : null);
                }
            }
            pipeline.Return(chunk);
            if (options.Progress is { } progress && rowsRead >= nextProgress)
            {
                progress(rowsRead);
                lastReported = rowsRead;
                nextProgress = rowsRead + interval;
            }
        }
        // The final count, unless the last chunk's report already said it (a catalogue of exactly N × interval rows
        // printed "read N rows" twice).
        if ((rows.Count > 0 || rowsRead > 0) && rowsRead != lastReported) options.Progress?.Invoke(rowsRead);

        double[]? Num(ColumnRole role)
        {
            int k = Array.FindIndex(bindings, b => b.Role == role);
            return k < 0 ? null : numeric[k]!.Build();
        }
        string[]? Txt(ColumnRole role)
        {
            int k = Array.FindIndex(bindings, b => b.Role == role);
            return k < 0 ? null : text[k]!.Build();
        }
        var extra = new Dictionary<string, double[]>();
        for (int k = 0; k < kept.Length; k++) extra[mapping.Kept[k].Name] = kept[k].Build();
        for (int k = 0; k < bindings.Length; k++) nulls[bindings[k].Role] = nullCounts[k];

        var sample = new CatalogueRows(source, rows.Build(), Num(ColumnRole.Z)!,
            id: Txt(ColumnRole.Id), zErr: Num(ColumnRole.ZErr), thetaRad: Num(ColumnRole.Theta), thetaErrRad: Num(ColumnRole.ThetaErr),
            mu: Num(ColumnRole.Mu), muErr: Num(ColumnRole.MuErr), mag: Num(ColumnRole.Mag), magErr: Num(ColumnRole.MagErr),
            band: Txt(ColumnRole.Band), sizeDefinition: mapping.SizeDefinition, extraColumns: extra,
            survey: new SurveyColumns(Num(ColumnRole.AbsMag), Num(ColumnRole.LogMass), Num(ColumnRole.FluxDensity),
                Num(ColumnRole.SersicN), Txt(ColumnRole.Group), Num(ColumnRole.Weight)));
        // Warnings of the reader (repeated column names) and of the data (sizes implausible in the stated unit) travel with
        // the mapping's, so fit, run and inspect show them on stderr and in the results' notes.
        var readerWarnings = reader.Notes.Where(n => n.StartsWith("warning: ", StringComparison.Ordinal)).ToArray();
        var dataWarnings = AngularSizePlausibility.Check(sample.ThetaRad, mapping).Concat(MagnitudeColumnCheck.Check(mapping, reader.Columns)).ToArray();
        if (readerWarnings.Length + dataWarnings.Length > 0) mapping = mapping.WithNotes([.. readerWarnings, .. dataWarnings]);
        for (int k = 0; k < labelCandidates.Count; k++)
            if (labelCandidates[k].Index == groupIndex)
                foreach (var label in sample.Survey.Group!) labelTallies[k].Add(label);
        var populations = labelTallies.Select(t => t.Result()).OfType<PopulationLabelColumn>().ToArray();
        return new CatalogueLoad(sample, rejects, mapping, reader.Format, reader.TableName, reader.Columns,
            reader.Notes.Where(n => !n.StartsWith("warning: ", StringComparison.Ordinal)).ToArray(), rowsRead, nulls) { PopulationLabels = populations };
    }

    private static string Fmt(double v) => v.ToString("R", CultureInfo.InvariantCulture);

    // "0,53", "-1,2e3": a number written with a decimal comma (European locales), which the invariant reader does not take.
    [System.Text.RegularExpressions.GeneratedRegex(@"^\s*[+-]?\d*,\d+([eE][+-]?\d+)?\s*$")]
    private static partial System.Text.RegularExpressions.Regex DecimalComma();

    /// <summary>The reject detail of a cell that is not a number, with a hint when it is a number written with a decimal comma.</summary>
    internal static string NotANumber(string text) =>
        DecimalComma().IsMatch(text) ? "not a number (a decimal comma? write the decimal point as '.', e.g. 0.53)" : "not a number";

    /// <summary>Validates row <paramref name="r"/>; fills <paramref name="values"/> with normalised values; returns the reject entry or null.</summary>
    private static RejectEntry? Check(RowChunk chunk, int r, RoleBinding[] bindings, ResolvedMapping mapping, double[] values,
        int thetaSlot, int zSlot, CatalogueLoadOptions options)
    {
        long pos = chunk.Positions[r];
        if (chunk.RowProblem(r) is { } problem) return new RejectEntry(pos, "", "", RejectReason.Unparsable, problem);
        for (int k = 0; k < bindings.Length; k++)
        {
            var b = bindings[k];
            var buf = chunk.Columns[k];
            var state = buf.States[r];
            if (state == CellState.Null) return new RejectEntry(pos, b.ColumnName, "", RejectReason.MissingValue, $"{b.Role.Name()} has no value");
            if (state == CellState.Invalid)
                return new RejectEntry(pos, b.ColumnName, buf.InvalidText(r), RejectReason.Unparsable, b.Role.IsText() ? "cannot be read as text" : NotANumber(buf.InvalidText(r)));
            if (b.Role.IsText()) continue;
            double raw = buf.Numbers![r];
            if (!double.IsFinite(raw)) return new RejectEntry(pos, b.ColumnName, Fmt(raw), RejectReason.NonFinite, "not a finite number");
            double v = raw * b.Scale;
            switch (b.Role)
            {
                case ColumnRole.Z:
                    if (v <= 0) return new RejectEntry(pos, b.ColumnName, Fmt(raw), RejectReason.NonPositiveRedshift,
                        bindings.Any(x => x.Role == ColumnRole.ZErr)
                            ? "z must be > 0 (a photometric redshift too: its K-correction and catalogue-cosmology distance are taken at z, so a z at or below 0 is rejected rather than integrated over; the fit's redshift prior starts above 0)"
                            : "z must be > 0");
                    if (v > options.MaxRedshift) return new RejectEntry(pos, b.ColumnName, Fmt(raw), RejectReason.OutOfRange, $"z above {Fmt(options.MaxRedshift)}");
                    break;
                case ColumnRole.Theta:
                    if (v <= 0) return new RejectEntry(pos, b.ColumnName, Fmt(raw), RejectReason.NonPositiveSize, "size must be > 0");
                    if (!(v < Math.PI)) return new RejectEntry(pos, b.ColumnName, Fmt(raw), RejectReason.OutOfRange, "size of π rad or more");
                    break;
                case ColumnRole.ZErr or ColumnRole.ThetaErr:
                    if (v < 0) return new RejectEntry(pos, b.ColumnName, Fmt(raw), RejectReason.NegativeError, "error must be >= 0");
                    if (b.IsRelative) v *= values[b.Role == ColumnRole.ZErr ? zSlot : thetaSlot];
                    if (!double.IsFinite(v)) return new RejectEntry(pos, b.ColumnName, Fmt(raw), RejectReason.NonFinite, "not finite after conversion");
                    break;
                case ColumnRole.Mu or ColumnRole.Mag:
                    if (Math.Abs(v) > options.MaxAbsMagnitude) return new RejectEntry(pos, b.ColumnName, Fmt(raw), RejectReason.OutOfRange, $"|value| above {Fmt(options.MaxAbsMagnitude)} mag (a sentinel?)");
                    break;
                case ColumnRole.AbsMag:
                    if (Math.Abs(v) > options.MaxAbsMagnitude) return new RejectEntry(pos, b.ColumnName, Fmt(raw), RejectReason.OutOfRange, $"|value| above {Fmt(options.MaxAbsMagnitude)} mag (a sentinel?)");
                    break;
                case ColumnRole.LogMass:
                    if (!(v > 0 && v < 16)) return new RejectEntry(pos, b.ColumnName, Fmt(raw), RejectReason.OutOfRange, "log10(M/Msun) outside 0–16 (a linear mass or a sentinel?)");
                    break;
                case ColumnRole.FluxDensity:
                    if (!(v > 0)) return new RejectEntry(pos, b.ColumnName, Fmt(raw), RejectReason.OutOfRange, "flux density must be > 0");
                    break;
                case ColumnRole.SersicN:
                    if (!(v >= 0.05 && v <= 50)) return new RejectEntry(pos, b.ColumnName, Fmt(raw), RejectReason.OutOfRange, "Sérsic index outside 0.05–50");
                    break;
                case ColumnRole.Weight:
                    if (!(v > 0)) return new RejectEntry(pos, b.ColumnName, Fmt(raw), RejectReason.OutOfRange, "weight must be > 0");
                    break;
                case ColumnRole.MuErr or ColumnRole.MagErr:
                    if (v < 0) return new RejectEntry(pos, b.ColumnName, Fmt(raw), RejectReason.NegativeError, "error must be >= 0");
                    if (v > options.MaxAbsMagnitude) return new RejectEntry(pos, b.ColumnName, Fmt(raw), RejectReason.OutOfRange, $"error above {Fmt(options.MaxAbsMagnitude)} mag (a sentinel?)");
                    break;
            }
            values[k] = v;
        }
        return null;
    }
}

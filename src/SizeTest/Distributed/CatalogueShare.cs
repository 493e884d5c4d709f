using SizeTest.Catalogues;
using SizeTest.Catalogues.Parquet;

namespace SizeTest.Distributed;

/// <summary>
/// One rank's share of a catalogue: a Parquet file is read by row groups (<see cref="RowPartition.RowGroups"/>), so no
/// rank holds the whole catalogue; other formats are loaded whole on every rank and the accepted rows split by range
/// (<see cref="RowPartition.RowRange"/>). The counts and the reject log are this rank's contribution to the totals:
/// with a whole-file load rank 0 contributes them all, so every rejected row is counted exactly once.
/// </summary>
/// <param name="Local">This rank's accepted rows (possibly none); <see cref="CatalogueRows.SourceRows"/> are file rows.</param>
/// <param name="Whole">The whole accepted sample when the format was loaded whole, else null.</param>
/// <param name="RowsRead">Rows read counted by this rank.</param>
/// <param name="Accepted">Rows accepted counted by this rank.</param>
/// <param name="Rejected">Rows rejected counted by this rank.</param>
/// <param name="Rejects">Reject log of the rows counted by this rank.</param>
public sealed record CatalogueShare(CatalogueRows Local, CatalogueRows? Whole, long RowsRead, long Accepted, long Rejected, RejectLog Rejects)
{
    /// <summary>Chunk key per local row for <see cref="Inference.Evaluation.EvaluationBackend"/>: Parquet, (row group,
    /// position in the group / chunk rows); null for the other formats (the backend's default, index / chunk rows).</summary>
    public IReadOnlyList<long>? ChunkKeys { get; init; }

    /// <summary>Unit warnings of the column mapping (<see cref="ResolvedMapping.Warnings"/>), for the CLI to print once.</summary>
    public IReadOnlyList<string> UnitWarnings { get; init; } = [];

    /// <summary>Notes on columns that could be fitted as separate populations (<see cref="CatalogueLoad.PopulationLabels"/>),
    /// for one process only: a group fit does not run under MPI (and a Parquet share counts only its own rows).</summary>
    public IReadOnlyList<string> PopulationNotes { get; init; } = [];

    /// <summary>Loads the share of rank <paramref name="rank"/> of <paramref name="size"/>; no collective calls (may throw per rank).</summary>
    public static CatalogueShare Load(string path, CatalogueLoadOptions options, int rank, int size)
    {
        ArgumentNullException.ThrowIfNull(path);
        ArgumentNullException.ThrowIfNull(options);
        if (CatalogueReaders.DetectFormat(path) == CatalogueFormat.Parquet && options.Reader.Format is null or CatalogueFormat.Parquet)
        {
            int first, end;
            IReadOnlyList<long> groups;
            using (var table = ParquetTableReader.Open(path))
            {
                groups = table.RowGroupRowCounts.ToArray();
                (first, end) = RowPartition.RowGroups(groups, rank, size);
            }
            using var reader = ParquetCatalogueReader.Open(path, first, end);
            var load = CatalogueLoader.Load(reader, options);
            return new CatalogueShare(load.Rows, null, load.RowsRead, load.Rows.Count, load.RejectLog.Count, load.RejectLog)
            {
                ChunkKeys = ParquetChunkKeys(load.Rows.SourceRows, groups),
                UnitWarnings = load.Mapping.Warnings,
                PopulationNotes = size == 1 ? load.PopulationLabels.Select(p => p.Note).ToArray() : [],
            };
        }
        var whole = CatalogueLoader.Load(path, options);
        NoAcceptedRows.ThrowIfEmpty(whole, path);
        const int chunk = Inference.Evaluation.EvaluationBackend.ChunkRows;
        int n = whole.Rows.Count;
        var (cs, ce) = RowPartition.RowRange((n + chunk - 1) / chunk, rank, size);
        long s = Math.Min(n, cs * chunk), e = Math.Min(n, ce * chunk);
        bool root = rank == 0;
        return new CatalogueShare(Slice(whole.Rows, (int)s, (int)e), whole.Rows,
            root ? whole.RowsRead : 0, root ? whole.Rows.Count : 0, root ? whole.RejectLog.Count : 0,
            root ? whole.RejectLog : new RejectLog(whole.RejectLog.SourceName))
        {
            UnitWarnings = whole.Mapping.Warnings,
            PopulationNotes = size == 1 ? whole.PopulationLabels.Select(p => p.Note).ToArray() : [],
        };
    }

    /// <summary>
    /// Collective: the all-rank row counts and, on rank 0, the CSV of every rank's rejects in rank order (each rank's
    /// rows are in file order and the ranks' row groups are contiguous, so this is file order). The reject rows travel
    /// as broadcasts of UTF-16 code units, one rank after another.
    /// </summary>
    public CatalogueTotals Combine(IRankReducer ranks)
    {
        ArgumentNullException.ThrowIfNull(ranks);
        var totals = new double[3];
        ranks.SumAll([RowsRead, Accepted, Rejected], totals);
        string csv = Rejects.ToCsv();
        int header = csv.IndexOf('\n') + 1;
        var text = new System.Text.StringBuilder(csv[..header]);
        if (totals[2] > 0)
        {
            for (int r = 0; r < ranks.Size; r++)
            {
                string mine = ranks.Rank == r ? csv[header..] : "";
                var length = new double[] { mine.Length };
                ranks.Broadcast(length, r);
                if (length[0] == 0) continue;
                var units = new double[(int)length[0]];
                if (ranks.Rank == r) for (int i = 0; i < mine.Length; i++) units[i] = mine[i];
                ranks.Broadcast(units, r);
                if (ranks.IsRoot) foreach (var u in units) text.Append((char)u);
            }
        }
        return new CatalogueTotals((long)totals[0], (long)totals[1], (long)totals[2], ranks.IsRoot ? text.ToString() : "");
    }

    // (row group << 32) | (position in the group / chunk rows), from 1-based file rows.
    private static long[] ParquetChunkKeys(IReadOnlyList<long> rows, IReadOnlyList<long> groupRowCounts)
    {
        var starts = new long[groupRowCounts.Count + 1];
        for (int g = 0; g < groupRowCounts.Count; g++) starts[g + 1] = starts[g] + groupRowCounts[g];
        var keys = new long[rows.Count];
        int group = 0;
        for (int i = 0; i < rows.Count; i++)
        {
            long r = rows[i] - 1;
            while (group + 1 < groupRowCounts.Count && r >= starts[group + 1]) group++; // rows ascend within a share
            keys[i] = ((long)group << 32) | ((r - starts[group]) / Inference.Evaluation.EvaluationBackend.ChunkRows);
        }
        return keys;
    }

    private static CatalogueRows Slice(CatalogueRows x, int start, int end)
    {
        T[]? Part<T>(T[]? a) => a?[start..end];
        var extra = x.ExtraColumns.ToDictionary(kv => kv.Key, kv => kv.Value[start..end]);
        return new CatalogueRows(x.SourceName, RowNumbers.FromArray(Enumerable.Range(start, end - start).Select(i => x.SourceRows[i]).ToArray()),
            x.Z[start..end], Part(x.Id), Part(x.ZErr), Part(x.ThetaRad), Part(x.ThetaErrRad), Part(x.Mu), Part(x.MuErr), Part(x.Mag), Part(x.MagErr),
            Part(x.Band), x.SizeDefinition, extra,
            new SurveyColumns(Part(x.Survey.AbsMag), Part(x.Survey.LogMass), Part(x.Survey.FluxDensityJy), Part(x.Survey.SersicN), Part(x.Survey.Group), Part(x.Survey.Weight)));
    }
}

/// <summary>All-rank totals of a distributed catalogue load.</summary>
/// <param name="RowsRead">Rows read (= accepted + rejected).</param>
/// <param name="Accepted">Rows accepted.</param>
/// <param name="Rejected">Rows rejected.</param>
/// <param name="RejectCsv">On rank 0, the reject log of all ranks as CSV (header <c>row,column,value,reason,detail</c>); empty elsewhere.</param>
public sealed record CatalogueTotals(long RowsRead, long Accepted, long Rejected, string RejectCsv);

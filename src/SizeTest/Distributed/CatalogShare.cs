using SizeTest.Catalogs;
using SizeTest.Catalogs.Parquet;

namespace SizeTest.Distributed;

/// <summary>
/// One rank's share of a catalogue: a Parquet file is read by row groups (<see cref="RowPartition.RowGroups"/>), so no
/// rank holds the whole catalogue; other formats are loaded whole on every rank and the accepted rows split by range
/// (<see cref="RowPartition.RowRange"/>). The counts and the reject log are this rank's contribution to the totals:
/// with a whole-file load rank 0 contributes them all, so every rejected row is counted exactly once.
/// </summary>
/// <param name="Local">This rank's accepted rows (possibly none); <see cref="Sample.SourceRows"/> are file rows.</param>
/// <param name="Whole">The whole accepted sample when the format was loaded whole, else null.</param>
/// <param name="RowsRead">Rows read counted by this rank.</param>
/// <param name="Accepted">Rows accepted counted by this rank.</param>
/// <param name="Rejected">Rows rejected counted by this rank.</param>
/// <param name="Rejects">Reject log of the rows counted by this rank.</param>
public sealed record CatalogShare(Sample Local, Sample? Whole, long RowsRead, long Accepted, long Rejected, RejectLog Rejects)
{
    /// <summary>Loads the share of rank <paramref name="rank"/> of <paramref name="size"/>; no collective calls (may throw per rank).</summary>
    public static CatalogShare Load(string path, CatalogLoadOptions options, int rank, int size)
    {
        ArgumentNullException.ThrowIfNull(path);
        ArgumentNullException.ThrowIfNull(options);
        if (CatalogReaders.DetectFormat(path) == CatalogFormat.Parquet && options.Reader.Format is null or CatalogFormat.Parquet)
        {
            int first, end;
            using (var table = ParquetTableReader.Open(path))
                (first, end) = RowPartition.RowGroups(table.RowGroupRowCounts, rank, size);
            using var reader = ParquetCatalogReader.Open(path, first, end);
            var load = CatalogLoader.Load(reader, options);
            return new CatalogShare(load.Sample, null, load.RowsRead, load.Sample.Count, load.RejectLog.Count, load.RejectLog);
        }
        var whole = CatalogLoader.Load(path, options);
        var (s, e) = RowPartition.RowRange(whole.Sample.Count, rank, size);
        bool root = rank == 0;
        return new CatalogShare(Slice(whole.Sample, (int)s, (int)e), whole.Sample,
            root ? whole.RowsRead : 0, root ? whole.Sample.Count : 0, root ? whole.RejectLog.Count : 0,
            root ? whole.RejectLog : new RejectLog(whole.RejectLog.SourceName));
    }

    /// <summary>
    /// Collective: the all-rank row counts and, on rank 0, the CSV of every rank's rejects in rank order (each rank's
    /// rows are in file order and the ranks' row groups are contiguous, so this is file order). The reject rows travel
    /// as broadcasts of UTF-16 code units, one rank after another.
    /// </summary>
    public CatalogTotals Combine(IRankReducer ranks)
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
        return new CatalogTotals((long)totals[0], (long)totals[1], (long)totals[2], ranks.IsRoot ? text.ToString() : "");
    }

    private static Sample Slice(Sample x, int start, int end)
    {
        T[]? Part<T>(T[]? a) => a?[start..end];
        var extra = x.ExtraColumns.ToDictionary(kv => kv.Key, kv => kv.Value[start..end]);
        return new Sample(x.SourceName, RowNumbers.FromArray(Enumerable.Range(start, end - start).Select(i => x.SourceRows[i]).ToArray()),
            x.Z[start..end], Part(x.Id), Part(x.ZErr), Part(x.ThetaRad), Part(x.ThetaErrRad), Part(x.Mu), Part(x.MuErr), Part(x.Mag), Part(x.MagErr),
            Part(x.Band), x.SizeDefinition, extra);
    }
}

/// <summary>All-rank totals of a distributed catalogue load.</summary>
/// <param name="RowsRead">Rows read (= accepted + rejected).</param>
/// <param name="Accepted">Rows accepted.</param>
/// <param name="Rejected">Rows rejected.</param>
/// <param name="RejectCsv">On rank 0, the reject log of all ranks as CSV (header <c>row,column,value,reason,detail</c>); empty elsewhere.</param>
public sealed record CatalogTotals(long RowsRead, long Accepted, long Rejected, string RejectCsv);

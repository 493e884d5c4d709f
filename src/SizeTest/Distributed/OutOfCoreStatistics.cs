using SizeTest.Catalogs;
using SizeTest.Catalogs.Parquet;
using SizeTest.Photometry;

namespace SizeTest.Distributed;

/// <summary>What one out-of-core pass over a rank's row groups produced.</summary>
/// <param name="Statistics">The compressed angular-size likelihood of the accepted rows.</param>
/// <param name="RowsRead">Rows read (all row groups of this rank).</param>
/// <param name="Accepted">Rows accepted by the loader's validation.</param>
/// <param name="Rejects">The rejected rows of this rank, with reasons (row numbers are rows of the whole file).</param>
/// <param name="RowGroups">Row groups [First, End) this rank read.</param>
public sealed record OutOfCoreResult(SufficientStatistics Statistics, long RowsRead, long Accepted, IReadOnlyList<RejectEntry> Rejects, (int First, int End) RowGroups)
{
    /// <summary>Rows rejected (RowsRead = Accepted + Rejected).</summary>
    public long Rejected => Rejects.Count;
}

/// <summary>
/// Out-of-core mode for catalogues larger than memory: reads a Parquet file one row group at a time
/// (only this rank's share of row groups), validates each group with the ordinary catalogue loader (same
/// mapping, reject log and row accounting as an in-memory load), converts it to ln θ observables and adds it
/// to <see cref="SufficientStatistics"/>; memory is one row group plus the statistics. Each rank then
/// evaluates its statistics and the partial sums are Allreduced as usual.
/// </summary>
public static class OutOfCoreStatistics
{
    /// <summary>
    /// Builds the statistics of rank <paramref name="rank"/> of <paramref name="size"/> for <paramref name="path"/>.
    /// <paramref name="grid"/> must be the same on all ranks (fix it from the survey's redshift range, e.g.
    /// [10⁻³, <see cref="CatalogLoadOptions.MaxRedshift"/>]). Rows without angular size or its error are rejected by
    /// the size requirement of this likelihood (reported as missing values).
    /// </summary>
    public static OutOfCoreResult Build(string path, CatalogLoadOptions options, LogRedshiftGrid grid, int varianceClasses,
        double varianceMin, double varianceMax, int rank = 0, int size = 1, Action<long>? progress = null)
    {
        ArgumentNullException.ThrowIfNull(path);
        ArgumentNullException.ThrowIfNull(options);
        ArgumentNullException.ThrowIfNull(grid);
        var stats = new SufficientStatistics(grid, varianceClasses, varianceMin, varianceMax);
        var rejects = new List<RejectEntry>();
        long read = 0, accepted = 0;
        (int First, int End) groups;
        using (var table = ParquetTableReader.Open(path))
            groups = RowPartition.RowGroups(table.RowGroupRowCounts, rank, size);
        for (int g = groups.First; g < groups.End; g++)
        {
            using var reader = ParquetCatalogReader.Open(path, g, g + 1);
            var load = CatalogLoader.Load(reader, options);
            read += load.RowsRead;
            rejects.AddRange(load.RejectLog.Entries);
            var sample = load.Sample;
            if (sample.Count > 0 && (sample.ThetaRad is null || sample.ThetaErrRad is null))
                throw new Common.InputException("the out-of-core angular-size likelihood needs theta and theta_err columns; map them with --col theta=NAME --col theta_err=NAME", path);
            if (sample.Count == 0) { progress?.Invoke(read); continue; }
            var obs = Observables.FromSample(sample);
            var columns = KernelColumns.Build(obs.Z, obs.LnTheta!, obs.LnThetaErr!, grid);
            stats.Add(columns, 0, columns.Count);
            accepted += sample.Count;
            progress?.Invoke(read);
        }
        return new OutOfCoreResult(stats, read, accepted, rejects, groups);
    }
}

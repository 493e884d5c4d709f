using SizeTest.Catalogues;
using SizeTest.Catalogues.Parquet;
using SizeTest.Distributed;
using Xunit;

namespace SizeTest.Tests.Catalogues.Parquet;

/// <summary>Parquet through the catalogue loader: the same sample, reject log and row accounting as CSV.</summary>
public sealed class ParquetCatalogueReaderTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-parquet-loader-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    // SYNTHETIC catalogue with one fault of each kind the loader checks: missing z, z ≤ 0, θ ≤ 0,
    // negative error, a non-numeric θ text, plus clean rows.
    private static readonly string?[] Ids = ["a", "b", "c", "d", "e", "f", "g", "h"];
    private static readonly double[] Z = [0.5, 0.7, -0.1, 1.2, 0.9, 2.0, 0.3, 1.1];
    private static readonly bool[] ZNull = [false, true, false, false, false, false, false, false];
    private static readonly string?[] Theta = ["1.5", "1.2", "0.9", "0", "1.1", "abc", "2.5", "0.8"];
    private static readonly double[] ThetaErr = [0.1, 0.1, 0.1, 0.1, -0.2, 0.1, 0.1, 0.1];

    private string WriteCsv()
    {
        var path = Path.Combine(_dir, "cat.csv");
        var lines = new List<string> { "id,z,theta,theta_err" };
        for (int i = 0; i < Z.Length; i++)
            lines.Add($"{Ids[i]},{(ZNull[i] ? "" : Z[i].ToString("R", System.Globalization.CultureInfo.InvariantCulture))},{Theta[i]},{ThetaErr[i].ToString("R", System.Globalization.CultureInfo.InvariantCulture)}");
        File.WriteAllLines(path, lines);
        return path;
    }

    private string WriteParquet(int rowGroupRows)
    {
        var path = Path.Combine(_dir, $"cat-{rowGroupRows}.parquet");
        ParquetTableWriter.Write(path, [ParquetColumnValues.Text("id", Ids), ParquetColumnValues.Number("z", Z, ZNull),
            ParquetColumnValues.Text("theta", Theta), ParquetColumnValues.Number("theta_err", ThetaErr)], rowGroupRows);
        return path;
    }

    [Theory]
    [InlineData(3)]
    [InlineData(100)]
    public void LoadsLikeCsvWithTheSameRejectsAndRowAccounting(int rowGroupRows)
    {
        var csv = CatalogueLoader.Load(WriteCsv());
        var pq = CatalogueLoader.Load(WriteParquet(rowGroupRows));
        Assert.Equal(CatalogueFormat.Parquet, pq.Format);
        Assert.Equal(8, pq.RowsRead);
        Assert.Equal(pq.RowsRead, pq.Accepted + pq.Rejected);
        Assert.Equal(csv.RowsRead, pq.RowsRead);
        Assert.Equal(csv.Accepted, pq.Accepted);
        Assert.Equal(csv.Rows.Z, pq.Rows.Z);
        Assert.Equal(csv.Rows.ThetaRad, pq.Rows.ThetaRad);
        Assert.Equal(csv.Rows.Id, pq.Rows.Id);
        Assert.Equal(csv.RejectLog.Entries.Select(e => (e.Reason, e.Column, e.Value)), pq.RejectLog.Entries.Select(e => (e.Reason, e.Column, e.Value)));
        // Parquet positions are 1-based table rows; CSV positions are file lines (header = line 1).
        Assert.Equal(csv.RejectLog.Entries.Select(e => e.Row - 1), pq.RejectLog.Entries.Select(e => e.Row));
        Assert.Equal([1L, 7, 8], pq.Rows.SourceRows.ToArray()); // rows 2–6 each carry one fault (see the arrays above)
    }

    [Fact]
    public void DetectedByMagicBytesAndExtension()
    {
        var path = WriteParquet(4);
        Assert.Equal(CatalogueFormat.Parquet, CatalogueReaders.DetectFormat(path));
        var renamed = Path.Combine(_dir, "noext.dat");
        File.Copy(path, renamed);
        Assert.Equal(CatalogueFormat.Parquet, CatalogueReaders.DetectFormat(renamed));
        Assert.True(CatalogueReaders.TryParseFormat("parquet", out var f) && f == CatalogueFormat.Parquet);
    }

    [Fact]
    public void RanksReadingTheirRowGroupsTogetherLoadEveryRowOnce()
    {
        var path = WriteParquet(2); // 4 row groups of 2 rows
        var whole = CatalogueLoader.Load(path);
        var accepted = new List<long>(); var rejected = new List<long>(); long read = 0;
        for (int rank = 0; rank < 3; rank++)
        {
            using var table = ParquetTableReader.Open(path);
            var (first, end) = RowPartition.RowGroups(table.RowGroupRowCounts, rank, 3);
            using var reader = ParquetCatalogueReader.Open(path, first, end);
            var part = CatalogueLoader.Load(reader);
            accepted.AddRange(part.Rows.SourceRows);
            rejected.AddRange(part.RejectLog.Entries.Select(e => e.Row));
            read += part.RowsRead;
        }
        Assert.Equal(whole.RowsRead, read);
        Assert.Equal(whole.Rows.SourceRows.ToArray(), accepted);
        Assert.Equal(whole.RejectLog.Entries.Select(e => e.Row), rejected);
    }
}

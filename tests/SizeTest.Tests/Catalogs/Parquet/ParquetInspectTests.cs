using SizeTest.Catalogs.Parquet;
using SizeTest.Tests.Cli;
using Xunit;

namespace SizeTest.Tests.Catalogs.Parquet;

public sealed class ParquetInspectTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-parquet-inspect-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    [Fact]
    public void InspectReadsParquetWithRowAccounting()
    {
        // SYNTHETIC three-row catalogue, one row with z ≤ 0.
        var path = Path.Combine(_dir, "tiny.parquet");
        ParquetTableWriter.Write(path, [ParquetColumnValues.Number("z", [0.5, -1, 1.5]), ParquetColumnValues.Number("theta", [1.2, 0.8, 0.6])], rowGroupRows: 2);
        var (exit, stdout, stderr) = CliRunner.Run("inspect", path);
        Assert.True(exit == 0, stderr);
        Assert.Contains("format:    Parquet", stdout);
        Assert.Contains("2 row groups, 3 rows", stdout);
        Assert.Contains("rows: 3 read, 2 accepted, 1 rejected", stdout);
        Assert.Contains("row 2", stdout);

        (exit, stdout, _) = CliRunner.Run("inspect", path, "--format", "json");
        Assert.Equal(0, exit);
        Assert.Contains("\"format\": \"parquet\"", stdout);
    }
}

using System.Text.Json;
using SizeTest.Catalogues.Parquet;
using SizeTest.Distributed;
using SizeTest.Tests.Catalogues.Parquet;
using Xunit;

namespace SizeTest.Tests.Cli;

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

    [Fact]
    public void FitReadsParquetWithTheSameRowAccounting()
    {
        // SYNTHETIC 3000-row catalogue (SyntheticKernelRows, Einstein–de Sitter truth), row 4 with z < 0.
        const int n = 3000;
        var z = new double[n]; var y = new double[n]; var e = new double[n];
        SyntheticKernelRows.Fill(8, 0, z, y, e);
        var th = y.Select(v => Math.Exp(v) * SizeTest.Foundation.Angles.AngleUnits.ArcsecPerRadian).ToArray();
        z[3] = -0.5;
        var path = Path.Combine(_dir, "fit.parquet");
        ParquetTableWriter.Write(path, [ParquetColumnValues.Number("z", z), ParquetColumnValues.Number("theta", th),
            ParquetColumnValues.Number("theta_err", th.Select((t, i) => t * e[i]).ToArray())], rowGroupRows: 700);
        var outDir = Path.Combine(_dir, "out");
        var (exit, _, stderr) = CliRunner.Run("fit", path, "--models", "eds", "--cv-folds", "0", "--out", outDir);
        Assert.True(exit == 0, stderr);
        var json = JsonDocument.Parse(File.ReadAllText(Path.Combine(outDir, "results.json"))).RootElement;
        Assert.Equal(3000, json.GetProperty("rows_read").GetInt64());
        Assert.Equal(2999, json.GetProperty("accepted").GetInt64());
        Assert.Equal(1, json.GetProperty("rejected").GetInt64());
    }
}

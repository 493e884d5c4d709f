using SizeTest.Catalogues;
using SizeTest.Catalogues.Parquet;
using SizeTest.Foundation.Errors;
using SizeTest.Tests.Catalogues;
using Xunit;

namespace SizeTest.Tests.Hardening;

/// <summary>Issue 14 point 10: Parquet errors said "line 1"; a Parquet file has row groups and rows, not lines.</summary>
public sealed class ParquetErrorLocationTests
{
    [Fact]
    public void LocationCanNameARowInsteadOfALine()
    {
        Assert.Equal("f.parquet, row 5, column 'z': bad", new InputException("bad", "f.parquet", 5, "z", lineLabel: "row").Message);
        Assert.Equal("f.csv, line 5, column 'z': bad", new InputException("bad", "f.csv", 5, "z").Message);
    }

    [Fact]
    public void DamagedDataPagesNameTheRowGroupAndRow()
    {
        using var t = new TempFiles();
        var path = t.PathOf("c.parquet");
        var z = Enumerable.Range(1, 40).Select(i => i * 0.01).ToArray();
        var theta = Enumerable.Range(1, 40).Select(i => 1.0 + i).ToArray();
        ParquetTableWriter.Write(path, [ParquetColumnValues.Number("z", z, null), ParquetColumnValues.Number("theta", theta, null)], 20);
        var bytes = File.ReadAllBytes(path);
        // Damage the first data page (just after the 4-byte 'PAR1' magic); the footer at the end stays intact.
        for (int i = 4; i < 40; i++) bytes[i] = 0xFF;
        File.WriteAllBytes(path, bytes);
        var ex = Assert.Throws<InputException>(() => CatalogueLoader.Load(path));
        Assert.DoesNotContain("line ", ex.Message);
        Assert.Contains("row group 0 (rows 1–20)", ex.Message);
        Assert.Contains("c.parquet, row 1, column 'z'", ex.Message);
    }
}

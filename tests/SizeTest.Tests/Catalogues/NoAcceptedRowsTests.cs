using SizeTest.Catalogues;
using SizeTest.Foundation.Errors;
using SizeTest.Tests.Cli;
using Xunit;

namespace SizeTest.Tests.Catalogues;

/// <summary>
/// A catalogue written in a European locale (semicolons between cells, decimal commas) is read without error but no cell is a
/// number: every row must be rejected with a hint at the decimal comma, and a fit must stop (exit 2) naming the file, the
/// commonest reason and a first example, not "no objects to fit".
/// </summary>
public sealed class NoAcceptedRowsTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-noaccepted-").FullName;

    public void Dispose()
    {
        try { Directory.Delete(_dir, true); } catch (IOException) { }
    }

    private string DecimalCommaCatalogue()
    {
        var p = Path.Combine(_dir, "komma.csv");
        File.WriteAllText(p, "z;theta;mu\n0,5;1,2;22,1\n0,8;0,9;23,0\n1,1;0,7;23,5\n");
        return p;
    }

    [Theory]
    [InlineData("0,53", true)]
    [InlineData("-1,2e3", true)]
    [InlineData(",5", true)]
    [InlineData("abc", false)]
    [InlineData("1,2,3", false)]
    public void TheRejectDetailHintsAtADecimalComma(string cell, bool hint) =>
        Assert.Equal(hint, CatalogueLoader.NotANumber(cell).Contains("decimal comma", StringComparison.Ordinal));

    [Fact]
    public void EveryRowRejectedWithTheHint()
    {
        var load = CatalogueLoader.Load(DecimalCommaCatalogue());
        Assert.Equal(3, load.RowsRead);
        Assert.Equal(0, load.Accepted);
        Assert.Equal(3, load.Rejected); // read = accepted + rejected
        Assert.All(load.RejectLog.Entries, e => Assert.Contains("decimal comma", e.Detail, StringComparison.Ordinal));
        var e = Assert.Throws<InputException>(() => NoAcceptedRows.ThrowIfEmpty(load, "komma.csv"));
        Assert.Contains("no row was accepted: 3 rows read, all rejected; most for 'unparsable' (3 rows; e.g. row 2, column 'z', value '0,5'", e.Message, StringComparison.Ordinal);
        Assert.Equal("komma.csv", e.File);
    }

    [Fact]
    public void FitStopsWithExitTwoNamingTheFileAndTheReason()
    {
        var cat = DecimalCommaCatalogue();
        var (exit, _, err) = CliRunner.Run("fit", cat, "--out", Path.Combine(_dir, "out"));
        Assert.Equal(2, exit);
        Assert.Contains("komma.csv", err, StringComparison.Ordinal);
        Assert.Contains("decimal comma", err, StringComparison.Ordinal);
        Assert.False(Directory.Exists(Path.Combine(_dir, "out")));
        Assert.True(File.Exists(cat)); // the input is untouched
    }
}

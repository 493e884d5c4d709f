using System.Text.Json;
using SizeTest.Catalogues;
using SizeTest.Foundation.Errors;
using Xunit;

namespace SizeTest.Tests.Catalogues;

/// <summary>
/// IPAC tables (IRSA's column-aligned text format) against a fixture written by an independent writer: astropy 5.2.1's
/// ascii 'ipac' writer (Reference/Catalogues/make_ipac_fixture.py); expected values are astropy's own read-back
/// (fixture_ipac.json), compared exactly. Before this reader such a file was read as whitespace text with the keyword
/// line '\ synthetic …' as its header.
/// </summary>
public sealed class IpacReaderTests
{
    private static string Fixture => ReferenceFiles.PathOf("fixture_ipac.tbl");

    private static JsonElement Reference() => JsonDocument.Parse(File.ReadAllText(ReferenceFiles.PathOf("fixture_ipac.json"))).RootElement;

    [Fact]
    public void EveryColumnReadsBackAsAstropyReadsIt()
    {
        using var reader = CatalogueReaders.Open(Fixture);
        var r = Reference();
        Assert.Equal(r.GetProperty("columns").EnumerateArray().Select(c => c.GetString()), reader.Columns.Select(c => c.Name));
        Assert.Equal(r.GetProperty("units").EnumerateArray().Select(u => u.ValueKind == JsonValueKind.Null ? null : u.GetString()), reader.Columns.Select(c => c.Unit));
        Assert.Equal([ColumnKind.Text, ColumnKind.Real, ColumnKind.Real, ColumnKind.Real, ColumnKind.Integer], reader.Columns.Select(c => c.Kind));
        var (positions, values) = TableReading.ReadAll(reader);
        Assert.Equal(new long[] { 7, 8, 9, 10, 11 }, positions);                 // file lines: 2 keyword/comment + 4 header lines
        foreach (var column in reader.Columns)
        {
            var expected = r.GetProperty("values").GetProperty(column.Name).EnumerateArray()
                .Select(v => v.ValueKind switch { JsonValueKind.Null => null, JsonValueKind.String => (object?)v.GetString(), _ => v.GetDouble() });
            Assert.Equal(expected, values[column.Name]);                         // reference: astropy 5.2.1 read-back
        }
        Assert.Contains(reader.Notes, n => n.StartsWith("layout: IPAC table; 4 header lines", StringComparison.Ordinal));
    }

    [Fact]
    public void LoadsWithDetectionAndTheUnitsOfTheHeader()
    {
        var load = CatalogueLoader.Load(Fixture);
        Assert.Equal((5L, 4L, 1L), (load.RowsRead, load.Accepted, load.Rejected));
        Assert.Equal((9L, RejectReason.MissingValue), (load.RejectLog.Entries[0].Row, load.RejectLog.Entries[0].Reason));
        Assert.Equal(["G 001", "G002", "G004", "G005"], load.Rows.Id!);                               // 'objname' is an id
        Rel.Equal(0.4125 * Math.PI / 648000.0, load.Rows.ThetaRad![0]);                              // 412.5 mas; 1″ = π/648000 rad

        var (exit, stdout, _) = SizeTest.Tests.Cli.CliRunner.Run("inspect", Fixture);
        Assert.Equal(0, exit);
        Assert.Contains("format:    IPAC table (column-aligned text)", stdout);
        Assert.Contains("theta     ← r_e [mas, from the file]", stdout);
    }

    [Fact]
    public void OwnNullValuesMisalignedLinesAndHeaderErrors()
    {
        using var t = new TempFiles();
        var p = t.Write("h.tbl", string.Join("\n",
            "|  id |    z |  theta |",
            "| c   |  r   | d      |",
            "|     |      | arcsec |",
            "| -   | -999 |  0     |",
            "   a    0.5    0.40   ",
            "   b   -999    0.30   ",
            "   c    0.7    0      ",
            "   d    0.81234567  0.2",    // a value running under the bar after z
            "   e    0.9    0.25     x",  // text after the last bar
            "   f    1.1           ") + "\n"); // blank theta: null
        using (var reader = CatalogueReaders.Open(p))
        {
            var (_, values) = TableReading.ReadAll(reader);
            // Line 8's z is cut at the bar (0.812); the row carries a problem, so the loader never accepts the cut value.
            Assert.Equal(new object?[] { 0.5, null, 0.7, 0.812, 0.9, 1.1 }, values["z"]);
            Assert.Equal(new object?[] { 0.40, 0.30, null, "INVALID:4567  0.", 0.25, null }, values["theta"]);   // '0' is theta's null value
        }
        var load = CatalogueLoader.Load(p);
        Assert.Equal(6L, load.RowsRead);
        Assert.Equal(["a"], load.Rows.Id!);
        var e = load.RejectLog.Entries;
        Assert.Contains("under a '|' of the header (between columns 'z' and 'theta')", e.Single(x => x.Row == 8).Detail);
        Assert.Contains("text after the last column 'theta'", e.Single(x => x.Row == 9).Detail);
        Assert.All(e.Where(x => x.Row is 8 or 9), x => Assert.Equal(RejectReason.Unparsable, x.Reason));

        var five = t.Write("five.tbl", "|a|\n|r|\n| |\n| |\n| |\n 1 \n");
        Assert.Equal(5, Assert.Throws<InputException>(() => CatalogueReaders.Open(five)).Line);
        var uneven = t.Write("uneven.tbl", "| a | b |\n| r |\n 1   2\n");
        Assert.Equal(2, Assert.Throws<InputException>(() => CatalogueReaders.Open(uneven)).Line);
        var type = t.Write("type.tbl", "| a |\n| q |\n 1 \n");
        Assert.Contains("unknown IPAC data type 'q'", Assert.Throws<InputException>(() => CatalogueReaders.Open(type)).Message);

        // A table whose every line is between bars is bar-delimited text, not IPAC.
        var bars = t.Write("bars.txt", "|id|z|theta|\n|a|0.5|0.4|\n");
        using var text = CatalogueReaders.Open(bars);
        Assert.DoesNotContain(text.Notes, n => n.Contains("IPAC", StringComparison.Ordinal));
    }
}

using SizeTest.Catalogues;
using SizeTest.Catalogues.VoTable;
using SizeTest.Foundation.Errors;
using Xunit;

namespace SizeTest.Tests.Catalogues;

/// <summary>
/// VOTable reading against fixtures written by astropy 5.2.1's astropy.io.votable
/// (Reference/Catalogues/make_fits_fixtures.py) in both serialisations; expected values are the
/// astropy FITS read-back of the same data (fixture_tables.json), compared exactly.
/// </summary>
public sealed class VoTableReaderTests
{
    [Theory]
    [InlineData("fixture_tabledata.vot", "TABLEDATA")]
    [InlineData("fixture_binary2.vot", "BINARY2")]
    public void BothSerialisationsReadBackValuesUnitsAndUcds(string file, string serialisation)
    {
        var path = ReferenceFiles.PathOf(file);
        Assert.Equal(CatalogueFormat.VoTable, CatalogueReaders.DetectFormat(path));
        using var reader = CatalogueReaders.Open(path);
        Assert.Contains($"serialisation: {serialisation}", reader.Notes);
        Assert.Equal(new[] { "ID", "z", "theta", "theta_err", "mu", "nobj", "flag" }, reader.Columns.Select(c => c.Name));
        Assert.Equal("arcsec", reader.Columns[2].Unit);
        Assert.Equal("phys.angSize;src", reader.Columns[2].Ucd);
        Assert.Equal("mag.arcsec-2", reader.Columns[4].Unit); // astropy writes the VOUnit spelling
        Assert.Equal(ColumnKind.Text, reader.Columns[0].Kind);
        Assert.Equal(ColumnKind.Boolean, reader.Columns[6].Kind);
        var (positions, values) = TableReading.ReadAll(reader, chunkRows: 4);
        Assert.Equal(new long[] { 1, 2, 3, 4, 5, 6 }, positions);
        // reference: astropy 5.2.1 (same data as the FITS fixture; nulls: ID row 3, theta row 4, nobj row 5)
        Assert.Equal(TableReading.Expected("GALAXIES", "ID"), values["ID"]);
        foreach (var c in new[] { "z", "theta", "theta_err", "mu", "nobj", "flag" })
            Assert.Equal(TableReading.Expected("GALAXIES", c), values[c]);
    }

    [Theory]
    [InlineData("fixture_tabledata.vot")]
    [InlineData("fixture_binary2.vot")]
    public void LoadsWithUcdDetection(string file)
    {
        var load = CatalogueLoader.Load(ReferenceFiles.PathOf(file));
        Assert.Equal(6, load.RowsRead);
        Assert.Equal(4, load.Accepted);
        Assert.Equal(new long[] { 3, 4 }, load.RejectLog.Entries.Select(e => e.Row));
        Assert.Equal(TableReading.Expected("GALAXIES", "mu").Where((_, i) => i is not (2 or 3)).Cast<double>(), load.Rows.Mu!);
        Assert.Contains(load.DetectionReport, l => l.StartsWith("theta_err") && l.Contains("named by role"));
    }

    [Fact]
    public void HandWrittenVoTableWithNullsTablesAndMalformedRows()
    {
        // Hand-written from the VOTable 1.4 recommendation: two TABLEs, VALUES null, empty TD, NaN, a short TR.
        using var t = new TempFiles();
        var p = t.Write("h.xml", """
            <?xml version="1.0"?>
            <VOTABLE version="1.4" xmlns="http://www.ivoa.net/xml/VOTable/v1.3">
             <RESOURCE>
              <TABLE name="first"><FIELD name="a" datatype="int"/><DATA><TABLEDATA><TR><TD>1</TD></TR></TABLEDATA></DATA></TABLE>
              <TABLE name="sizes">
               <FIELD name="redshift" datatype="float"/>
               <FIELD name="Re" datatype="double" unit="mas" ucd="phys.angSize;src"><DESCRIPTION>half-light radius</DESCRIPTION></FIELD>
               <FIELD name="e_Re" datatype="double" ucd="stat.error"><VALUES null="-1"/></FIELD>
               <DATA><TABLEDATA>
                <TR><TD>0.5</TD><TD>120</TD><TD>5</TD></TR>
                <TR><TD>NaN</TD><TD>100</TD><TD>5</TD></TR>
                <TR><TD>0.7</TD><TD>90</TD><TD>-1</TD></TR>
                <TR><TD>0.8</TD><TD>80</TD></TR>
                <TR><TD>0.9</TD><TD></TD><TD>2</TD></TR>
               </TABLEDATA></DATA>
              </TABLE>
             </RESOURCE>
            </VOTABLE>
            """);
        var load = CatalogueLoader.Load(p, new CatalogueLoadOptions { Reader = new ReaderOptions { Table = "sizes" } });
        Assert.Equal("TABLE 2 'sizes'", load.Table);
        Assert.Equal(5, load.RowsRead);
        Assert.Equal(1, load.Accepted);
        // A written-out NaN is rejected as non-finite, as in every other reader (issue 14 point 10).
        Assert.Equal(new[] { RejectReason.NonFinite, RejectReason.MissingValue, RejectReason.Unparsable, RejectReason.MissingValue },
            load.RejectLog.Entries.Select(e => e.Reason));
        Rel.Equal(120 * Math.PI / 648000e3, load.Rows.ThetaRad![0]); // mas from the FIELD unit
        Rel.Equal(5 * Math.PI / 648000e3, load.Rows.ThetaErrRad![0]); // error companion by UCD stat.error next to Re; unit same as theta
        Assert.Equal("half-light radius", load.Columns[1].Description);
        var byIndex = CatalogueLoader.Load(p, new CatalogueLoadOptions { Reader = new ReaderOptions { Table = "2" }, Mapping = ColumnMapping.FromOptions(["z=redshift"]) });
        Assert.Equal(1, byIndex.Accepted);
    }

    [Fact]
    public void BadXmlIsOneInputExceptionWithTheLine()
    {
        using var t = new TempFiles();
        var p = t.Write("bad.vot", "<?xml version=\"1.0\"?>\n<VOTABLE><RESOURCE><TABLE><FIELD name=\"z\" datatype=\"double\"/>\n<DATA><TABLEDATA><TR><TD>1</TD></TR>\n<TR><TD>2</TD></TABLEDATA></DATA></TABLE></RESOURCE></VOTABLE>");
        var ex = Assert.Throws<InputException>(() => CatalogueLoader.Load(p));
        Assert.Contains("bad.vot", ex.Message);
        Assert.Equal(4, ex.Line); // the mismatched </TABLEDATA> is on line 4
    }

    [Fact]
    public void WriterRoundTrips()
    {
        using var t = new TempFiles();
        var table = new CatalogueTable("demo").AddText("id", ["x<&>", null]).AddReal("z", [0.25, double.NaN], ucd: "src.redshift").AddInteger("n", [3, -4]);
        var p = t.PathOf("w.vot");
        VoTableWriter.Write(p, table, "synthetic demo catalogue");
        using var reader = CatalogueReaders.Open(p);
        Assert.Equal("src.redshift", reader.Columns[1].Ucd);
        var (_, v) = TableReading.ReadAll(reader);
        Assert.Equal(new object?[] { "x<&>", null }, v["id"]);
        Assert.Equal(new object?[] { 0.25, null }, v["z"]);
        Assert.Equal(new object?[] { 3.0, -4.0 }, v["n"]);
    }
}

using SizeTest.Catalogues;
using SizeTest.Tests.Cli;
using Xunit;

namespace SizeTest.Tests.Catalogues;

/// <summary>
/// Detection of the columns of catalogues written by source-extraction and survey pipelines. The naming is common practice,
/// taken from the pipelines' own parameter lists: SExtractor (Bertin &amp; Arnouts 1996; its parameter list, doc/src/Param.rst and
/// src/param.h) names magnitudes MAG_AUTO, MAG_ISO, MAG_ISOCOR, MAG_APER, MAG_PETRO, MAG_BEST, MAG_MODEL and their errors
/// MAGERR_&lt;X&gt; (fluxes FLUX_&lt;X&gt;, FLUXERR_&lt;X&gt;, in counts), with VOTable UCDs phot.mag / stat.stdev;phot.mag (MAG_AUTO
/// phot.mag;meta.main) and, for model-fitting, stat.error;phot.mag; the SDSS photometric tables name errors inside the name
/// (petroMag_r, petroMagErr_r; petroR50_r, petroR50Err_r).
/// </summary>
public sealed class PipelineColumnDetectionTests
{
    private static CatalogueColumn Col(string name, string? ucd = null, string? unit = null) => new(name, ColumnKind.Real, unit, ucd, null, "double");

    [Theory]
    // err put inside the name at each word boundary (common practice: MAGERR_AUTO, FLUXERR_ISO, petroMagErr_r, SPHEROID_REFFERR_WORLD).
    [InlineData("MAG_AUTO", "magerrauto")]
    [InlineData("FLUX_ISO", "fluxerriso")]
    [InlineData("MAG_APER[2]", "magerraper2|magapererr2")]
    [InlineData("petroMag_r", "petroerrmagr|petromagerrr")]
    [InlineData("SPHEROID_REFF_WORLD", "spheroiderrreffworld|spheroidrefferrworld")]
    [InlineData("re", "")]
    public void InnerErrorNamesPutErrAtEachWordBoundary(string value, string expected) =>
        Assert.Equal(expected, string.Join("|", MappingResolver.InnerErrorNames(value)));

    [Fact]
    public void SourceExtractionCsvPairsEachMagnitudeWithItsOwnError()
    {
        // A SExtractor-style table in its usual parameter order: the isophotal magnitude comes first.
        using var t = new TempFiles();
        var cat = t.Write("sex.csv", "NUMBER,z,re,MAG_ISO,MAGERR_ISO,MAG_AUTO,MAGERR_AUTO,FLUX_AUTO,FLUXERR_AUTO\n" +
                                     "1,0.5,1.2,22.9,0.05,22.4,0.04,1200,30\n2,0.8,0.9,23.6,0.08,23.1,0.07,650,25\n");
        var load = CatalogueLoader.Load(cat);
        var m = load.Mapping.Roles;
        // MAG_AUTO is a total magnitude by name; MAG_ISO is not (an isophotal magnitude misses light).
        Assert.Equal("MAG_AUTO", m[ColumnRole.Mag].ColumnName);
        Assert.Equal("MAGERR_AUTO", m[ColumnRole.MagErr].ColumnName);
        Assert.Equal("error companion of 'MAG_AUTO' by name", m[ColumnRole.MagErr].Reason);
        Assert.Equal(new[] { 0.04, 0.07 }, load.Rows.MagErr!); // the file's values, read back exactly
        // FLUX_AUTO is in counts, not a flux density: it stays unmapped.
        Assert.False(m.ContainsKey(ColumnRole.FluxDensity));

        // inspect shows the pairing with its reason.
        var (exit, output, _) = CliRunner.Run("inspect", cat);
        Assert.Equal(0, exit);
        Assert.Contains("mag_err   ← MAGERR_AUTO [mag, default; the column has no unit] (because error companion of 'MAG_AUTO' by name)", output);
    }

    [Fact]
    public void AMagnitudeMappedByHandTakesItsOwnPipelineError()
    {
        var cols = new[] { Col("z"), Col("MAG_ISO"), Col("MAGERR_ISO"), Col("MAG_AUTO"), Col("MAGERR_AUTO") };
        var m = MappingResolver.Resolve(cols, ColumnMapping.FromOptions(["mag=MAG_ISO"]), "x");
        Assert.Equal("MAG_ISO", m.Roles[ColumnRole.Mag].ColumnName);
        Assert.Equal("MAGERR_ISO", m.Roles[ColumnRole.MagErr].ColumnName);
        // SDSS style: the error's "Err" sits before the band suffix.
        var sdss = new[] { Col("z"), Col("petroR50_r"), Col("petroR50Err_r"), Col("petroMag_r"), Col("petroMagErr_r") };
        var s = MappingResolver.Resolve(sdss, ColumnMapping.FromOptions(["theta=petroR50_r", "mag=petroMag_r"]), "x");
        Assert.Equal("petroR50Err_r", s.Roles[ColumnRole.ThetaErr].ColumnName);
        Assert.Equal("petroMagErr_r", s.Roles[ColumnRole.MagErr].ColumnName);
    }

    [Fact]
    public void ANamePairingOutranksAUcdThatFitsEveryMagnitude()
    {
        // Model-fitting magnitudes carry stat.error;phot.mag: before, the first such column (MAGERR_ISO) was taken for MAG_AUTO.
        var cols = new[]
        {
            Col("z", "src.redshift"),
            Col("MAG_ISO", "phot.mag"), Col("MAGERR_ISO", "stat.error;phot.mag"),
            Col("MAG_AUTO", "phot.mag;meta.main"), Col("MAGERR_AUTO", "stat.error;phot.mag;meta.main"),
        };
        var m = MappingResolver.Resolve(cols, ColumnMapping.Detect, "x");
        Assert.Equal("MAG_AUTO", m.Roles[ColumnRole.Mag].ColumnName); // meta.main ranks it first among the phot.mag columns
        Assert.Equal("MAGERR_AUTO", m.Roles[ColumnRole.MagErr].ColumnName);
        Assert.Equal("UCD stat.error;phot.mag;meta.main, error companion of 'MAG_AUTO' by name", m.Roles[ColumnRole.MagErr].Reason);
    }

    [Fact]
    public void SourceExtractionVoTablePairsByNameWhenItsErrorsAreStandardDeviations()
    {
        // SExtractor's VOTable UCDs: MAGERR_<X> is stat.stdev;phot.mag, not stat.error, so the pairing is by name.
        using var t = new TempFiles();
        var p = t.Write("sex.vot", """
            <?xml version="1.0"?>
            <VOTABLE version="1.4" xmlns="http://www.ivoa.net/xml/VOTable/v1.3">
             <RESOURCE><TABLE name="LDAC_OBJECTS">
              <FIELD name="NUMBER" datatype="int" ucd="meta.record"/>
              <FIELD name="Z" datatype="double" ucd="src.redshift"/>
              <FIELD name="MAG_ISO" datatype="float" unit="mag" ucd="phot.mag"/>
              <FIELD name="MAGERR_ISO" datatype="float" unit="mag" ucd="stat.stdev;phot.mag"/>
              <FIELD name="MAG_AUTO" datatype="float" unit="mag" ucd="phot.mag;meta.main"/>
              <FIELD name="MAGERR_AUTO" datatype="float" unit="mag" ucd="stat.stdev;phot.mag;meta.main"/>
              <DATA><TABLEDATA>
               <TR><TD>1</TD><TD>0.5</TD><TD>22.9</TD><TD>0.05</TD><TD>22.4</TD><TD>0.04</TD></TR>
               <TR><TD>2</TD><TD>0.8</TD><TD>23.6</TD><TD>0.08</TD><TD>23.1</TD><TD>0.07</TD></TR>
              </TABLEDATA></DATA>
             </TABLE></RESOURCE>
            </VOTABLE>
            """);
        var load = CatalogueLoader.Load(p);
        Assert.Equal("MAG_AUTO", load.Mapping.Roles[ColumnRole.Mag].ColumnName);
        Assert.Equal("MAGERR_AUTO", load.Mapping.Roles[ColumnRole.MagErr].ColumnName);
        Assert.Equal(new[] { 0.04f, 0.07f }.Select(f => (double)f), load.Rows.MagErr!); // float cells widened exactly
        Assert.Contains(load.DetectionReport, l => l.StartsWith("mag_err   ← MAGERR_AUTO") && l.Contains("error companion of 'MAG_AUTO' by name"));
    }
}

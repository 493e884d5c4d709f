using SizeTest.Catalogues;
using Xunit;

namespace SizeTest.Tests.Catalogues;

/// <summary>
/// A surface-brightness column mapped (or detected) as the total magnitude <c>mag</c> warns: mean SB within R_e is
/// m + 2.5 log10(2π R_e²) (Graham &amp; Driver 2005), 2 mag fainter than m at R_e = 1″, so luminosities from it are wrong by a
/// size-dependent amount the unit "mag" cannot reveal.
/// </summary>
public sealed class MagnitudeColumnCheckTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-magcheck-").FullName;

    public void Dispose()
    {
        try { Directory.Delete(_dir, true); } catch (IOException) { }
    }

    private string Csv(string header)
    {
        var p = Path.Combine(_dir, Guid.NewGuid().ToString("N") + ".csv");
        File.WriteAllText(p, header + "\n0.5,1.2,22.1\n0.8,0.9,23.0\n1.1,0.7,23.5\n");
        return p;
    }

    [Theory]
    [InlineData("MU_MEAN", true)]
    [InlineData("sb_e", true)]
    [InlineData("mu", true)]
    [InlineData("surf_bright_r", true)]
    [InlineData("mag_auto", false)]
    [InlineData("r_total", false)]
    [InlineData("muse_mag", false)]
    public void AColumnNamedLikeASurfaceBrightnessWarnsWhenMappedAsMag(string column, bool warns)
    {
        var p = Csv($"z,theta,{column}");
        var load = CatalogueLoader.Load(p, new CatalogueLoadOptions { Mapping = ColumnMapping.FromOptions([$"mag={column}"]) });
        var w = load.Mapping.Warnings.Where(x => x.Contains("looks like a surface brightness", StringComparison.Ordinal)).ToList();
        Assert.Equal(warns, w.Count == 1);
        if (warns) Assert.Contains($"'{column}'", w[0], StringComparison.Ordinal);
        Assert.Equal(3, load.Rows.Count); // a warning, never a refusal
    }

    [Fact]
    public void AVoTableColumnWithTheSurfaceBrightnessUcdWarns()
    {
        var p = Path.Combine(_dir, "t.vot");
        File.WriteAllText(p, """
            <?xml version="1.0"?>
            <VOTABLE version="1.4" xmlns="http://www.ivoa.net/xml/VOTable/v1.3"><RESOURCE><TABLE>
            <FIELD name="z" datatype="double" ucd="src.redshift"/>
            <FIELD name="theta" datatype="double" unit="arcsec" ucd="phys.angSize;src"/>
            <FIELD name="bright" datatype="double" unit="mag" ucd="phot.mag.sb"/>
            <DATA><TABLEDATA><TR><TD>0.5</TD><TD>1.2</TD><TD>22.1</TD></TR><TR><TD>0.8</TD><TD>0.9</TD><TD>23.0</TD></TR></TABLEDATA></DATA>
            </TABLE></RESOURCE></VOTABLE>
            """);
        var load = CatalogueLoader.Load(p, new CatalogueLoadOptions { Mapping = ColumnMapping.FromOptions(["mag=bright"]) });
        Assert.Contains(load.Mapping.Warnings, x => x.Contains("its UCD is phot.mag.sb", StringComparison.Ordinal));
    }
}

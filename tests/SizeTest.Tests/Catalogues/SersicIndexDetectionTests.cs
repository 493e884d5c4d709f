using SizeTest.Catalogues;
using Xunit;

namespace SizeTest.Tests.Catalogues;

/// <summary>
/// sersic_n by UCD. The IVOA UCD1+ list (UCDlist 1.6) defines <c>src.morph.param</c> as "morphological parameter" and gives
/// axis ratios (<c>phys.size.axisRatio</c>), position angles (<c>pos.posAng</c>) and ellipticities (<c>src.ellipticity</c>)
/// words of their own; tables do put concentrations and classification parameters (SuperCOSMOS: "psi classification
/// parameter") and, loosely, axis ratios under <c>src.morph.param</c>. SExtractor writes SPHEROID_SERSICN ("Spheroid Sersic
/// index from fitting") as <c>src.morph;stat.fit.param</c>. Only a column whose name or description says Sérsic index is taken.
/// </summary>
public sealed class SersicIndexDetectionTests
{
    private static string? Detected(string name, string ucd, string? description = null)
    {
        var cols = new[] { new CatalogueColumn("z", ColumnKind.Real, null, null, null, "double"), new CatalogueColumn(name, ColumnKind.Real, null, ucd, description, "float") };
        var m = MappingResolver.Resolve(cols, ColumnMapping.Detect, "x");
        return m.Roles.TryGetValue(ColumnRole.SersicN, out var b) ? b.Reason : null;
    }

    [Theory]
    [InlineData("n", "src.morph.param", null, "UCD src.morph.param and a Sérsic-index name")]
    [InlineData("n_ser", "src.morph.param", "", "UCD src.morph.param and a Sérsic-index name")]
    [InlineData("NSER", "src.morph.param;meta.main", null, "UCD src.morph.param;meta.main and a Sérsic-index name")]
    [InlineData("SPHEROID_SERSICN", "src.morph;stat.fit.param", "Spheroid Sersic index from fitting", "UCD src.morph;stat.fit.param and a Sérsic-index name")]
    [InlineData("idx", "src.morph.param", "Sérsic index of the single-component fit", "UCD src.morph.param and a description of a Sérsic index")]
    [InlineData("idx", "src.morph.param", "Se\u0301rsic index", "UCD src.morph.param and a description of a Sérsic index")] // decomposed é
    [InlineData("shape", "src.morph.param", "index of the fitted light profile", "UCD src.morph.param and a description of a Sérsic index")]
    // Named n, described with a word of another parameter but as a Sérsic index all the same.
    [InlineData("n", "src.morph.param", "Sersic index (axis ratio free in the fit)", "UCD src.morph.param and a Sérsic-index name")]
    public void ASersicNameOrDescriptionIsTaken(string name, string ucd, string? description, string reason) =>
        Assert.Equal(reason, Detected(name, ucd, description));

    [Theory]
    [InlineData("q", "src.morph.param", "axis ratio b/a")]
    [InlineData("b/a", "src.morph.param", null)]
    [InlineData("pa", "src.morph.param", null)]
    [InlineData("ell", "src.morph.param", null)]
    [InlineData("axis_ratio", "src.morph.param", "Sersic model axis ratio")]
    [InlineData("n", "src.morph.param", "axis ratio")]                       // a name n that the description says is b/a
    [InlineData("n", "src.morph.param;phys.size.axisRatio", null)]           // or the UCD does
    [InlineData("C", "src.morph.param", "concentration index of the light profile, R90/R50")]
    [InlineData("psi", "src.morph.param", "psi classification parameter")]
    [InlineData("par1", "src.morph.param", null)]                            // a morphological parameter of unknown kind
    [InlineData("n", "phys.size", null)]                                    // no morphological UCD: n may be a count
    public void AnotherShapeParameterIsNeverTaken(string name, string ucd, string? description) =>
        Assert.Null(Detected(name, ucd, description));

    [Fact]
    public void AVoTableDescriptionIsRead()
    {
        using var t = new TempFiles();
        var p = t.Write("morph.vot", """
            <?xml version="1.0"?>
            <VOTABLE version="1.4" xmlns="http://www.ivoa.net/xml/VOTable/v1.3">
             <RESOURCE><TABLE>
              <FIELD name="z" datatype="double" ucd="src.redshift"/>
              <FIELD name="q" datatype="float" ucd="src.morph.param"><DESCRIPTION>Axis ratio b/a</DESCRIPTION></FIELD>
              <FIELD name="k" datatype="float" ucd="src.morph.param"><DESCRIPTION>Sérsic index</DESCRIPTION></FIELD>
              <DATA><TABLEDATA>
               <TR><TD>0.5</TD><TD>0.7</TD><TD>4</TD></TR>
               <TR><TD>0.9</TD><TD>0.4</TD><TD>1.5</TD></TR>
              </TABLEDATA></DATA>
             </TABLE></RESOURCE>
            </VOTABLE>
            """);
        var load = CatalogueLoader.Load(p);
        Assert.Equal("k", load.Mapping.Roles[ColumnRole.SersicN].ColumnName);
        Assert.Equal(new[] { 4.0, 1.5 }, load.Rows.Survey.SersicN!); // the file's values
        Assert.Contains(load.DetectionReport, l => l.StartsWith("sersic_n  ← k") && l.Contains("a description of a Sérsic index"));
    }
}

using SizeTest.Catalogues;
using SizeTest.Foundation.Errors;
using Xunit;
using SizeTest.Foundation.Angles;

namespace SizeTest.Tests.Catalogues;

public sealed class MappingAndUnitTests
{
    [Theory]
    // Exact definitions: 1° = 3600″ and 180° = π rad, so 1″ = π/648000 rad; 1′ = π/10800 rad; 1 mas = 10⁻³″; 1 µas = 10⁻⁶″ (IAU style guide units).
    [InlineData("arcsec", Math.PI / 648000)]
    [InlineData("arcseconds", Math.PI / 648000)]
    [InlineData("\"", Math.PI / 648000)]
    [InlineData("mas", Math.PI / 648000 / 1000)]
    [InlineData("uarcsec", Math.PI / 648000 / 1e6)]
    [InlineData("arcmin", Math.PI / 10800)]
    [InlineData("deg", Math.PI / 180)]
    [InlineData("degrees", Math.PI / 180)]
    [InlineData("rad", 1.0)]
    public void AngleUnitsFollowTheExactDefinitions(string unit, double radiansPerUnit)
    {
        Assert.True(CatalogueUnits.TryParseAngle(unit, out var f, out _));
        Assert.Equal(radiansPerUnit, f); // exact: the same double expression
    }

    [Fact]
    public void SharedArcsecConstantIsTheExactDefinition()
    {
        Assert.Equal(Math.PI / 648000.0, AngleUnits.RadiansPerArcsec); // 1″ = π/648000 rad by definition
        Rel.Equal(206264.80624709636, AngleUnits.ArcsecPerRadian);     // 648000/π, common practice value 206264.806…
        Rel.Equal(3600 * AngleUnits.RadiansPerArcsec, CatalogueUnits.RadiansPerDegree, 2.3e-16); // 1° = 3600″
        Rel.Equal(60 * AngleUnits.RadiansPerArcsec, CatalogueUnits.RadiansPerArcmin, 2.3e-16);   // 1′ = 60″
    }

    [Theory]
    [InlineData("mag/arcsec2")]
    [InlineData("mag.arcsec-2")]
    [InlineData("mag/arcsec**2")]
    [InlineData("mag/arcsec^2")]
    [InlineData("mag / arcsec2")]
    [InlineData("mag arcsec-2")]
    [InlineData("mag/sq.arcsec")]
    public void SurfaceBrightnessSpellings(string unit) => Assert.True(CatalogueUnits.IsSurfaceBrightness(unit));

    [Fact]
    public void NotAnAngleOrSurfaceBrightness()
    {
        Assert.False(CatalogueUnits.TryParseAngle("kpc", out _, out _));
        Assert.False(CatalogueUnits.IsSurfaceBrightness("mag"));
        Assert.False(CatalogueUnits.IsSurfaceBrightness("erg/s/cm2"));
    }

    [Fact]
    public void ParseAssignment()
    {
        Assert.Equal(new ColumnAssignment(ColumnRole.Theta, "Re", "mas"), ColumnMapping.ParseAssignment("theta=Re:mas"));
        Assert.Equal(new ColumnAssignment(ColumnRole.Z, "z_spec", null), ColumnMapping.ParseAssignment(" z = z_spec "));
        Assert.Equal(new ColumnAssignment(ColumnRole.ThetaErr, "e_Re", "frac"), ColumnMapping.ParseAssignment("theta-err=e_Re:frac"));
        Assert.Contains("unknown column role", Assert.Throws<InputException>(() => ColumnMapping.ParseAssignment("size=Re")).Message);
        Assert.Contains("ROLE=NAME", Assert.Throws<InputException>(() => ColumnMapping.ParseAssignment("theta")).Message);
        Assert.Contains("cannot be used for theta", Assert.Throws<InputException>(() => ColumnMapping.ParseAssignment("theta=Re:kpc")).Message);
        Assert.Contains("assigned twice", Assert.Throws<InputException>(() => ColumnMapping.FromOptions(["z=a", "z=b"])).Message);
    }

    [Fact]
    public void SizeDefinitionsParseAndFormat()
    {
        foreach (var text in new[] { "effective", "petrosian", "fwhm", "isophotal:25.5" })
        {
            Assert.True(SizeDefinitions.TryParse(text, out var d, out _));
            Assert.Equal(text, SizeDefinitions.Format(d));
        }
        Assert.False(SizeDefinitions.TryParse("isophotal", out _, out var err));
        Assert.Contains("level", err);
    }

    private static CatalogueColumn Col(string name, string? unit = null, string? ucd = null, ColumnKind kind = ColumnKind.Real) =>
        new(name, kind, unit, ucd, null, "double");

    [Fact]
    public void DetectionByUcdNameAndErrorCompanionsIsReported()
    {
        var cols = new[]
        {
            Col("OBJ", ucd: "meta.id;meta.main", kind: ColumnKind.Text),
            Col("zph", ucd: "src.redshift.phot"),
            Col("Rad", "arcsec", "phys.angSize;src"),
            Col("e_Rad", "arcsec", "stat.error;phys.angSize;src"),
            Col("SBe", "mag/arcsec2"),
            Col("SBe_err"),
            Col("Vmag", "mag", "phot.mag;em.opt.V"),
            Col("sigma_Vmag", "mag"),
        };
        var m = MappingResolver.Resolve(cols, ColumnMapping.Detect, "x");
        Assert.Equal("OBJ", m.Roles[ColumnRole.Id].ColumnName);
        Assert.Equal("zph", m.Roles[ColumnRole.Z].ColumnName);
        Assert.Equal("Rad", m.Roles[ColumnRole.Theta].ColumnName);
        Assert.Equal("e_Rad", m.Roles[ColumnRole.ThetaErr].ColumnName);
        Assert.Equal("SBe", m.Roles[ColumnRole.Mu].ColumnName);
        Assert.Equal("SBe_err", m.Roles[ColumnRole.MuErr].ColumnName);
        Assert.Equal("Vmag", m.Roles[ColumnRole.Mag].ColumnName);
        Assert.Equal("sigma_Vmag", m.Roles[ColumnRole.MagErr].ColumnName);
        var lines = m.ReportLines();
        Assert.Contains(lines, l => l.StartsWith("z ") && l.Contains("← zph") && l.Contains("UCD src.redshift.phot"));
        Assert.Contains(lines, l => l.StartsWith("theta_err") && l.Contains("UCD stat.error;phys.angSize;src"));
        Assert.Contains(lines, l => l.StartsWith("mu_err") && l.Contains("error companion of 'SBe' by name"));
        Assert.Contains(lines, l => l.StartsWith("not mapped: z_err, band"));
        Assert.Contains(lines, l => l.StartsWith("size definition: effective (because default"));
    }

    [Fact]
    public void ASizeWithANonAngleUnitIsPassedOverWithANote()
    {
        var cols = new[] { Col("z"), Col("size", "kpc"), Col("Re", "deg") };
        var m = MappingResolver.Resolve(cols, ColumnMapping.Detect, "x");
        Assert.Equal("Re", m.Roles[ColumnRole.Theta].ColumnName);
        Assert.Equal("deg", m.Roles[ColumnRole.Theta].Unit);
        Assert.Contains(m.Notes, n => n.Contains("passed over 'size'") && n.Contains("kpc"));
        var ex = Assert.Throws<InputException>(() => MappingResolver.Resolve(cols, ColumnMapping.FromOptions(["theta=size"]), "x.csv"));
        Assert.Contains("not an angle", ex.Message);
    }

    [Fact]
    public void RelativeErrorWithoutItsValueIsAnInputException()
    {
        var cols = new[] { Col("z"), Col("e_size") };
        var ex = Assert.Throws<InputException>(() => MappingResolver.Resolve(cols, ColumnMapping.FromOptions(["theta_err=e_size:%"]), "x.csv"));
        Assert.Contains("no theta column", ex.Message);
    }

    [Fact]
    public void RowNumbersAreCompactRuns()
    {
        var b = new RowNumbers.Builder();
        foreach (var r in new long[] { 3, 4, 5, 9, 10, 20 }) b.Add(r);
        var rows = b.Build();
        Assert.Equal(3, rows.RunCount);
        Assert.Equal(new long[] { 3, 4, 5, 9, 10, 20 }, rows.ToArray());
        Assert.Equal(10, rows[4]);
        Assert.Equal(6, rows.Length);
        RowNumbers fromArray = new long[] { 7, 8 };
        Assert.Equal(1, fromArray.RunCount);
    }
}

using SizeTest.Catalogues;
using Xunit;

namespace SizeTest.Tests.Catalogues;

/// <summary>
/// Unit strings read by the grammar of the FITS Standard 4.0 (2018), §4.3, Tables 6–9 (multiplication by "." "*" or
/// a space, division by "/", powers written as "arcsec2", "arcsec-2", "arcsec**2", "arcsec^2", "arcsec**(-2)"), and
/// IVOA VOUnit 1.0 (2014) §2. Cross-checked with astropy.units 5.2.1 (FITS, VOUnit and generic parsers):
/// Reference/Catalogues/unit_grammar.py and its output unit_grammar.txt (all spellings equal mag/arcsec**2).
/// </summary>
public sealed class UnitGrammarTests
{
    [Theory]
    // FITS Standard 4.0, §4.3, Table 6 (".", "*", " " multiply; "/" divides) and Table 7/8 (power forms "2", "-2", "**2", "^2", "**(-2)").
    [InlineData("mag/arcsec2")]
    [InlineData("mag.arcsec-2")]
    [InlineData("arcsec-2 mag")]
    [InlineData("mag/arcsec**2")]
    [InlineData("mag arcsec^-2")]
    [InlineData("mag arcsec**-2")]
    [InlineData("mag arcsec**(-2)")]
    [InlineData("mag*arcsec^(-2)")]
    [InlineData("arcsec-2.mag")]
    [InlineData("mag/(arcsec2)")]
    [InlineData("mag/(arcsec.arcsec)")]
    [InlineData("mag/arcsec/arcsec")]
    [InlineData("mag  /  arcsec2")]
    [InlineData("Mag/Arcsec2")] // case tolerance beyond the standard (common practice in catalogues)
    [InlineData("mag/arcsec²")]
    [InlineData("mag(AB)/arcsec2")]
    [InlineData("mag/sq.arcsec")]
    public void AllFitsSpellingsOfMagPerSquareArcsec(string unit) => Assert.True(CatalogueUnits.IsSurfaceBrightness(unit), unit);

    [Theory]
    // Not mag/arcsec² by the same grammar: wrong power, missing factor, extra factor, or malformed power.
    [InlineData("mag")]
    [InlineData("mag/arcsec")]
    [InlineData("mag arcsec2")]
    [InlineData("mag/arcmin2")]
    [InlineData("mag/arcsec2/s")]
    [InlineData("mag/arcsec**")]
    [InlineData("mag/arcsec^")]
    [InlineData("mag..arcsec-2")]
    [InlineData("mag/(arcsec2")]
    public void NotMagPerSquareArcsec(string unit) => Assert.False(CatalogueUnits.IsSurfaceBrightness(unit), unit);

    [Fact]
    public void ProductPowers()
    {
        // FITS 4.0 §4.3, Table 6: "str1 / str2" is str1 × str2⁻¹ and parentheses group; erg/(s.cm2) = erg s-1 cm-2.
        Assert.True(CatalogueUnits.TryParseProduct("erg/(s.cm2)", out var p));
        Assert.Equal(new Dictionary<string, int> { ["erg"] = 1, ["s"] = -1, ["cm"] = -2 }, p);
        Assert.True(CatalogueUnits.TryParseProduct("arcsec**(+2) deg-1", out p)); // Table 8: explicit sign in a power
        Assert.Equal(new Dictionary<string, int> { ["arcsec"] = 2, ["deg"] = -1 }, p);
        Assert.True(CatalogueUnits.TryParseProduct("arcsec2/arcsec2.mag", out p)); // powers cancel (closed form: 2 − 2 = 0)
        Assert.Equal(new Dictionary<string, int> { ["mag"] = 1 }, p);
    }

    [Theory]
    // Angle symbols (FITS 4.0 §4.3, Table 4: deg, arcmin, arcsec, mas; Table 3: rad) with spacing/case tolerance and
    // an explicit power 1; factors from the exact definitions 1° = π/180 rad, 1′ = 1°/60, 1″ = 1′/60, 1 mas = 10⁻³″.
    [InlineData(" arcsec ", Math.PI / 648000)]
    [InlineData("ARCSEC", Math.PI / 648000)]
    [InlineData("arcsec**1", Math.PI / 648000)]
    [InlineData("arcsec^(1)", Math.PI / 648000)]
    [InlineData("mas", Math.PI / 648000 / 1000)]
    [InlineData("Arcmin", Math.PI / 10800)]
    [InlineData("deg+1", Math.PI / 180)]
    [InlineData("RAD", 1.0)]
    public void AngleSymbolsWithTolerance(string unit, double radiansPerUnit)
    {
        Assert.True(CatalogueUnits.TryParseAngle(unit, out var f, out _), unit);
        Assert.Equal(radiansPerUnit, f); // exact: the same double expression
    }

    [Fact]
    public void AngleRejectsOtherPowers()
    {
        Assert.False(CatalogueUnits.TryParseAngle("arcsec2", out _, out _)); // an area, not an angle (FITS 4.0 Table 7)
        Assert.False(CatalogueUnits.TryParseAngle("arcsec-1", out _, out _));
        Assert.False(CatalogueUnits.TryParseAngle("arcsec.s", out _, out _));
    }

    private static CatalogueColumn Col(string name, string? unit) => new(name, ColumnKind.Real, unit, null, null, "double");

    [Fact]
    public void GivenUnitDifferentFromDeclaredWarns()
    {
        var cols = new[] { Col("z", null), Col("Re", "arcsec"), Col("SB", "mag.arcsec-2") };
        var mapping = ColumnMapping.FromOptions(["theta=Re:mas", "mu=SB:mag arcsec**-2"]);
        var r = MappingResolver.Resolve(cols, mapping, "t.fits");
        Assert.Equal("mas", r.Roles[ColumnRole.Theta].Unit);
        var warnings = r.ReportLines().Where(l => l.StartsWith("warning:", StringComparison.Ordinal)).ToArray();
        var w = Assert.Single(warnings); // the SB spellings are the same unit by FITS 4.0 §4.3, so no warning for mu
        Assert.Contains("'Re'", w);
        Assert.Contains("'arcsec'", w);
        Assert.Contains("'mas'", w);
    }

    [Fact]
    public void SameUnitSpelledDifferentlyDoesNotWarn()
    {
        var cols = new[] { Col("z", null), Col("Re", "arcsec**1") };
        var r = MappingResolver.Resolve(cols, ColumnMapping.FromOptions(["theta=Re:ARCSEC"]), "t.fits");
        Assert.DoesNotContain(r.ReportLines(), l => l.StartsWith("warning:", StringComparison.Ordinal));
    }

    [Fact]
    public void ErrorWithoutUnitTakesTheValuesGivenUnitInAnyOrder()
    {
        // theta_err given before theta: it still ends up in theta's unit (mas), factor π/648000/1000 rad.
        var cols = new[] { Col("z", null), Col("Re", null), Col("eRe", null) };
        var r = MappingResolver.Resolve(cols, ColumnMapping.FromOptions(["theta-err=eRe", "theta=Re:mas"]), "t.csv");
        Assert.Equal("mas", r.Roles[ColumnRole.ThetaErr].Unit);
        Assert.Equal(r.Roles[ColumnRole.Theta].Scale, r.Roles[ColumnRole.ThetaErr].Scale);
    }

    [Fact]
    public void ErrorDeclaredLikeTheCorrectedValueFollowsIt()
    {
        // The file declares arcsec for both; --col says the value is really mas, so the error is read in mas too, with a warning.
        var cols = new[] { Col("z", null), Col("Re", "arcsec"), Col("e_Re", "arcsec") };
        var r = MappingResolver.Resolve(cols, ColumnMapping.FromOptions(["theta=Re:mas"]), "t.fits");
        Assert.Equal("e_Re", r.Roles[ColumnRole.ThetaErr].ColumnName);
        Assert.Equal("mas", r.Roles[ColumnRole.ThetaErr].Unit);
        Assert.Contains(r.ReportLines(), l => l.StartsWith("warning:", StringComparison.Ordinal) && l.Contains("'e_Re'"));
    }

    [Fact]
    public void ErrorWithItsOwnDifferentDeclaredUnitKeepsIt()
    {
        // Declared arcmin error, arcsec value given as mas: the error is converted by its own declared unit (both end in radians).
        var cols = new[] { Col("z", null), Col("Re", "arcsec"), Col("e_Re", "arcmin") };
        var r = MappingResolver.Resolve(cols, ColumnMapping.FromOptions(["theta=Re:mas"]), "t.fits");
        Assert.Equal("arcmin", r.Roles[ColumnRole.ThetaErr].Unit);
        Assert.Equal(Math.PI / 10800, r.Roles[ColumnRole.ThetaErr].Scale); // 1′ = π/10800 rad exactly
    }

    [Fact]
    public void LoadedShareCarriesTheUnitWarningForTheCli()
    {
        // A CSV header "Re [arcsec]" declares arcsec; --col theta=Re:mas differs, so the share (what the fit command prints) has one warning.
        using var tmp = new TempFiles();
        var path = tmp.Write("u.csv", "z,Re [arcsec],e_Re\n0.5,1.2,0.1\n0.7,0.9,0.1\n");
        var options = new CatalogueLoadOptions { Mapping = ColumnMapping.FromOptions(["theta=Re:mas"]) };
        var share = SizeTest.Distributed.CatalogueShare.Load(path, options, 0, 1);
        var w = Assert.Single(share.UnitWarnings);
        Assert.Contains("'Re'", w);
        Assert.Contains("'mas'", w);
        Assert.False(w.StartsWith("warning:", StringComparison.Ordinal));
        // e_Re has no unit of its own, so it is read in mas like Re: 0.1 mas = 0.1 × π/648000e3 rad.
        var load = CatalogueLoader.Load(path, options);
        Assert.Equal("mas", load.Mapping.Roles[ColumnRole.ThetaErr].Unit);
    }
}

using SizeTest.Foundation.Errors;
using SizeTest.Photometry;
using Xunit;

namespace SizeTest.Tests.Photometry;

public sealed class PhotometryOptionParserTests
{
    private static readonly Dictionary<string, string> Files = new()
    {
        ["sed.txt"] = "# synthetic template\nlambda flux\n1000 1.0\n2000 0.5\n40000 0.2\n",
        ["r.txt"] = "# synthetic filter\n5500 0\n6000 1\n6500 1\n7000 0\n",
        ["b.txt"] = "3800 0\n4200 1\n4600 1\n5000 0\n",
        ["zp.txt"] = "# Vega to AB, synthetic values\nJ 0.91\nH 1.39\nK 1.85\n",
        ["coeffs.txt"] = "# Schlafly & Finkbeiner 2011 Table 6 style (synthetic numbers)\ng 3.303\nr 2.285\n",
        ["badrow.txt"] = "5500 0\n6000 x\n",
        ["dup.txt"] = "g 1\ng 2\n",
        ["decreasing.txt"] = "6000 1\n5000 1\n",
    };

    private static string Read(string path) =>
        Files.TryGetValue(path, out var t) ? t : throw new InputException("cannot read the file.", path);

    [Fact]
    public void SimpleKCorrectionForms()
    {
        Assert.IsType<KCorrectionOption.None>(PhotometryOptionParser.ParseKCorrection("none"));
        Assert.Equal("kc_r", Assert.IsType<KCorrectionOption.Column>(PhotometryOptionParser.ParseKCorrection("column:kc_r")).ColumnName);
        Assert.Equal(-1.5, Assert.IsType<KCorrectionOption.PowerLaw>(PhotometryOptionParser.ParseKCorrection("powerlaw:-1.5")).Alpha);
    }

    [Fact]
    public void TemplateWithFiltersAndReferences()
    {
        var t = Assert.IsType<KCorrectionOption.Template>(
            PhotometryOptionParser.ParseKCorrection("template:sed.txt,flux:fnu,filter-obs:r.txt,filter-rest:b.txt,reference-obs:ab", Read));
        Assert.Equal("sed.txt", t.Spectrum.Source);
        Assert.Equal(1000, t.Spectrum.MinLambdaAngstrom);
        Assert.Equal(1.0, t.Spectrum.FNuAt(1000));   // fnu read as given
        Assert.Equal("r", t.ObservedBand!.Name);
        Assert.Equal(3800, t.RestBand!.MinLambdaAngstrom);
        Assert.Null(t.ObservedReference);
        var nm = Assert.IsType<KCorrectionOption.Template>(
            PhotometryOptionParser.ParseKCorrection("template:sed.txt,filter-obs:r.txt,wavelength-unit:nm", Read));
        Assert.Equal(55000, nm.ObservedBand!.MinLambdaAngstrom);   // 5500 nm = 55000 Å
        // default flux is f_λ: f_ν = f_λ λ²/c
        Assert.Equal(1.0, nm.Spectrum.FNuAt(10000) * SpectralTable.SpeedOfLightAngstromPerSecond / (10000.0 * 10000.0), 12);   // 1000 nm = 10000 Å
    }

    [Fact]
    public void ExtinctionZeroPointsSersicAndSb()
    {
        var e = Assert.IsType<ExtinctionOption.ColourExcess>(PhotometryOptionParser.ParseExtinction("ebv:EBV,coeffs:coeffs.txt", Read));
        Assert.Equal("EBV", e.ColourExcessColumn);
        Assert.True(e.Coefficients.TryGet("r", out double rr));
        Assert.Equal(2.285, rr);
        Assert.Contains("Schlafly & Finkbeiner 2011", e.Coefficients.Source);
        Assert.Equal("A_r", Assert.IsType<ExtinctionOption.Column>(PhotometryOptionParser.ParseExtinction("column:A_r")).ColumnName);
        var zp = PhotometryOptionParser.ParseZeroPoints("zp.txt", Read);
        Assert.True(zp.TryGet("K", out double k));
        Assert.Equal(1.85, k);
        Assert.Equal(4.0, PhotometryOptionParser.ParseSersicIndex("4"));
        var sb = PhotometryOptionParser.ParseSurfaceBrightness("column:mean,to:effective");
        Assert.Equal(SurfaceBrightnessKind.MeanWithinEffective, sb.InputKind);
        Assert.Equal(SurfaceBrightnessKind.AtEffective, sb.OutputKind);
        Assert.True(PhotometryOptionParser.ParseSurfaceBrightness("from-mag").FromMagnitude);
    }

    [Fact]
    public void BandMatchSpec()
    {
        var m = PhotometryOptionParser.ParseBandMatch("target:4400,band:g=mu_g/mu_g_err@4770,band:r=mu_r/mu_r_err@r.txt,mode:interpolate", Read);
        Assert.Equal(4400, m.TargetLambdaAngstrom);
        Assert.Equal(BandMatchMode.Interpolate, m.Mode);
        Assert.Equal(2, m.Bands.Count);
        Assert.Equal(("g", "mu_g", "mu_g_err", 4770.0), (m.Bands[0].Name, m.Bands[0].MuColumn, m.Bands[0].MuErrColumn, m.Bands[0].EffectiveLambdaAngstrom));
        Assert.NotNull(m.Bands[1].Response);
        Assert.Equal(m.Bands[1].Response!.PivotWavelengthAngstrom, m.Bands[1].EffectiveLambdaAngstrom);
    }

    [Fact]
    public void WholeOptionSet()
    {
        var o = PhotometryOptionParser.Parse(new PhotometryOptionText
        {
            KCorrection = "powerlaw:-1", Extinction = "ebv:EBV,coeffs:coeffs.txt", ZeroPoints = "zp.txt",
            DefaultBand = "r", SersicIndex = "1", SurfaceBrightness = "column:effective",
        }, Read);
        Assert.IsType<KCorrectionOption.PowerLaw>(o.KCorrection);
        Assert.Equal("r", o.DefaultBand);
        Assert.Equal(1.0, o.SersicIndex);
        Assert.Equal(PhotometryOptions.Default, PhotometryOptionParser.Parse(new PhotometryOptionText()));
    }

    [Theory]
    [InlineData("", "kcorr: the value is empty")] // the setting's name; the CLI writes it as --kcorr
    [InlineData("sometimes", "expected none, column:NAME, powerlaw:ALPHA or template:FILE")]
    [InlineData("powerlaw:steep", "'steep' is not a number")]
    [InlineData("column:", "expected column:NAME")]
    [InlineData("template:sed.txt,filter:r.txt", "unknown item 'filter'")]
    [InlineData("template:sed.txt,flux:jansky", "flux:'jansky' is not flambda or fnu")]
    [InlineData("template:sed.txt,filter-obs:r.txt,filter-obs:b.txt", "'filter-obs' is given twice")]
    [InlineData("template:missing.txt", "missing.txt")]
    [InlineData("template:sed.txt,filter-obs:badrow.txt", "badrow.txt, line 2, column 2: 'x' is not a number")]
    [InlineData("template:sed.txt,filter-obs:decreasing.txt", "wavelengths must increase")]
    [InlineData("none,powerlaw:1", "expected none")]
    public void KCorrectionErrorsAreClear(string spec, string expected)
    {
        var e = Assert.Throws<InputException>(() => PhotometryOptionParser.ParseKCorrection(spec, Read));
        Assert.Contains(expected, e.Message);
    }

    [Theory]
    [InlineData("ebv:EBV", "needs coeffs:FILE")]
    [InlineData("ebv:EBV,coeffs:dup.txt", "band 'g' is listed twice")]
    [InlineData("magic", "expected none, column:NAME or ebv:COLUMN,coeffs:FILE")]
    public void ExtinctionErrorsAreClear(string spec, string expected)
    {
        var e = Assert.Throws<InputException>(() => PhotometryOptionParser.ParseExtinction(spec, Read));
        Assert.Contains(expected, e.Message);
    }

    [Theory]
    [InlineData("band:g=mu_g@4770", "give the rest-frame target band")]
    [InlineData("target:4400", "give at least one observed band")]
    [InlineData("target:4400,band:g@4770", "should read NAME=MU_COLUMN")]
    [InlineData("target:4400,band:g=mu_g@4770,mode:closest", "mode 'closest' is not nearest or interpolate")]
    [InlineData("target:-3,band:g=mu_g@4770", "must be > 0")]
    public void BandMatchErrorsAreClear(string spec, string expected)
    {
        var e = Assert.Throws<InputException>(() => PhotometryOptionParser.ParseBandMatch(spec, Read));
        Assert.Contains(expected, e.Message);
    }

    [Fact]
    public void OtherErrors()
    {
        Assert.Contains("between 0.05 and 50", Assert.Throws<InputException>(() => PhotometryOptionParser.ParseSersicIndex("0")).Message);
        Assert.Contains("not a number", Assert.Throws<InputException>(() => PhotometryOptionParser.ParseSersicIndex("four")).Message);
        Assert.Contains("not mean, effective or central", Assert.Throws<InputException>(() => PhotometryOptionParser.ParseSurfaceBrightness("column:median")).Message);
        Assert.Contains("filter-obs", Assert.Throws<InputException>(() => PhotometryOptionParser.Parse(new PhotometryOptionText { KCorrection = "template:sed.txt" }, Read)).Message);
        var e = Assert.Throws<InputException>(() => PhotometryFiles.ReadText("/nonexistent/dir/zp.txt"));
        Assert.Equal("/nonexistent/dir/zp.txt", e.File);
    }

    /// <summary>docs/photometry.md documents the option grammar: every example on the page written as flags
    /// (<c>`--kcorr powerlaw:-1`</c>, <c>`--band-match target:… --kcorr …`</c>) parses.</summary>
    [Fact]
    public void TheExamplesOfTheReferencePageParse()
    {
        string page = File.ReadAllText(Path.Combine(SizeTest.Tests.Studies.StudyFileParserTests.RepoRoot(), "docs", "photometry.md"));
        var examples = System.Text.RegularExpressions.Regex.Matches(page, @"`(--(?:kcorr|extinction|zero-points|band-match|band|sersic-n|sb) [^`]+)`")
            .Select(m => m.Groups[1].Value).ToList();
        Assert.NotEmpty(examples);
        foreach (var example in examples)
        {
            var text = new PhotometryOptionText();
            var tokens = example.Split(' ', StringSplitOptions.RemoveEmptyEntries);
            for (int i = 0; i + 1 < tokens.Length; i += 2)
                text = tokens[i] switch
                {
                    "--kcorr" => text with { KCorrection = tokens[i + 1] },
                    "--extinction" => text with { Extinction = tokens[i + 1] },
                    "--zero-points" => text with { ZeroPoints = tokens[i + 1] },
                    "--band-match" => text with { BandMatch = tokens[i + 1] },
                    "--band" => text with { DefaultBand = tokens[i + 1] },
                    "--sersic-n" => text with { SersicIndex = tokens[i + 1] },
                    "--sb" => text with { SurfaceBrightness = tokens[i + 1] },
                    _ => throw new Xunit.Sdk.XunitException($"'{tokens[i]}' in the example '{example}' is not a photometry option"),
                };
            var options = PhotometryOptionParser.Parse(text, Read);
            Assert.NotNull(options);
        }
    }
}

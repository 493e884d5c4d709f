using Xunit;
using SizeTest.Foundation.Errors;
using SizeTest.Inference;
using SizeTest.Studies;

namespace SizeTest.Tests.Studies;

public sealed class StudyFileParserTests
{
    private static StudyDefinition Parse(string text) => StudyFileParser.Parse(text, "s.toml", "/data");

    [Fact]
    public void ReadsEveryTable()
    {
        var s = Parse("""
            name = "full"
            seed = 42
            [catalogue]
            path = "cat/x.fits"
            format = "fits"
            table = 1
            size_definition = "isophotal:25"
            [columns]
            z = "zspec"
            theta = "Re:mas"
            [corrections]
            kcorr = "powerlaw:0.7"
            [models]
            names = ["lcdm", "tired-light"]
            observable = "joint"
            pivot_kpc = 4.0
            [models.lcdm]
            omega_m = { prior = [0.3, 0.02] }
            [models.tired-light]
            size_evolution = 0
            [parameters]
            size_evolution = { free = true, min = -3, max = 1 }
            [selection]
            sb_limit = 24.5
            min_size = 0.1
            [expected]
            size_evolution = [-1.5, -0.7]
            [inference]
            bootstrap = 10
            starts = 2
            [report]
            title = "T"
            paper = "letter"
            formats = ["html"]
            """);
        Assert.Equal("full", s.Name);
        Assert.Equal(42, s.Seed);
        Assert.Equal(Path.GetFullPath("/data/cat/x.fits"), s.CataloguePath);
        Assert.Equal(SizeTest.Catalogues.CatalogueFormat.Fits, s.Reader.Format);
        Assert.Equal("1", s.Reader.Table);
        Assert.Equal(25.0, s.Mapping.SizeDefinition!.IsophoteMagPerArcsec2);
        Assert.Equal("mas", s.Mapping.Assignments.Single(a => a.ColumnName == "Re").Unit);
        Assert.Equal("powerlaw:0.7", s.Corrections.KCorrection);
        Assert.Equal(ObservableKind.Joint, s.Nuisance.Observable);
        Assert.Equal(24.5, s.Nuisance.Cuts.SbLimit);
        Assert.Equal(0.1, s.Nuisance.Cuts.MinThetaArcsec);
        Assert.Equal(10, s.Bootstrap);
        Assert.Equal("Letter", s.Report.Paper.Name);
        Assert.False(s.Report.Pdf);
        Assert.Single(s.Expected);

        var hyps = StudyHypotheses.Build(s);
        var lcdm = hyps[0].Parameters.ToDictionary(p => p.Name);
        Assert.Equal(ParameterStatus.GaussianPrior, lcdm["omega_m"].Status);
        Assert.Equal(-3.0, lcdm["size_evolution"].Min);   // shared bounds from [parameters]
        var tl = hyps[1].Parameters.ToDictionary(p => p.Name);
        Assert.Equal(ParameterStatus.Fixed, tl["size_evolution"].Status); // the per-model table wins over [parameters]
        Assert.Equal(0.0, tl["size_evolution"].Value);
    }

    [Theory]
    // (text, expected line, expected column): unknown keys anywhere point at the key itself.
    [InlineData("name = \"x\"\ncolour = 1\n[catalogue]\npath = \"a.csv\"\n[models]\nnames = [\"lcdm\"]\n", 2, 1)]
    [InlineData("[catalogue]\npath = \"a.csv\"\n  tabel = 1\n[models]\nnames = [\"lcdm\"]\n", 3, 3)]
    [InlineData("[catalogue]\npath = \"a.csv\"\n[models]\nnames = [\"lcdm\"]\n[inference]\nbootstrapp = 3\n", 6, 1)]
    [InlineData("[catalogue]\npath = \"a.csv\"\n[models]\nnames = [\"lcdm\"]\n[parameters]\nomega_x = \"free\"\n", 6, 1)]
    [InlineData("[catalogue]\npath = \"a.csv\"\n[models]\nnames = [\"lcdm\"]\n[parameters]\nomega_m = { prior = [0.3, 0.02], sigma = 1 }\n", 6, 34)]  // the key inside the inline table
    [InlineData("[catalogue]\npath = \"a.csv\"\n[models]\nnames = [\"lcdm\", \"bogus\"]\n", 4, 18)]   // the offending list item
    public void UnknownKeysAndValuesNameLineAndColumn(string text, int line, int column)
    {
        var e = Assert.Throws<InputException>(() => Parse(text));
        Assert.Equal("s.toml", e.File);
        Assert.Equal(line, e.Line);
        Assert.Equal(column.ToString(System.Globalization.CultureInfo.InvariantCulture), e.Column);
    }

    [Theory]
    // Every format the readers have (CatalogueFormat) can be forced from a study, as with fit's --catalog-format.
    [InlineData("csv", SizeTest.Catalogues.CatalogueFormat.Text)]
    [InlineData("fits", SizeTest.Catalogues.CatalogueFormat.Fits)]
    [InlineData("votable", SizeTest.Catalogues.CatalogueFormat.VoTable)]
    [InlineData("parquet", SizeTest.Catalogues.CatalogueFormat.Parquet)]
    public void CatalogueFormatTakesEveryReader(string format, SizeTest.Catalogues.CatalogueFormat expected)
    {
        var s = Parse($"[catalogue]\npath = \"a.dat\"\nformat = \"{format}\"\n[models]\nnames = [\"lcdm\"]\n");
        Assert.Equal(expected, s.Reader.Format);
    }

    [Fact]
    public void UnknownKeyMessageNamesTheKey()
    {
        var e = Assert.Throws<InputException>(() => Parse("[catalogue]\npath = \"a.csv\"\nformatt = \"csv\"\n[models]\nnames = [\"lcdm\"]\n"));
        Assert.Contains("catalogue.formatt", e.Message);
        Assert.Contains("s.toml", e.Message);
    }

    [Fact]
    public void UnknownKeyCloseToAKnownOneGetsADidYouMean()
    {
        // Damerau–Levenshtein distance 1 from 'bootstrap' (a key [inference] takes); a far-off key gets no guess.
        var e = Assert.Throws<InputException>(() => Parse("[catalogue]\npath = \"a.csv\"\n[models]\nnames = [\"lcdm\"]\n[inference]\nbootstrapp = 3\n"));
        Assert.Contains("did you mean 'bootstrap'?", e.Message);
        var far = Assert.Throws<InputException>(() => Parse("[catalogue]\npath = \"a.csv\"\n[models]\nnames = [\"lcdm\"]\n[inference]\nzzzzzz = 3\n"));
        Assert.DoesNotContain("did you mean", far.Message);
    }

    [Theory]
    // (lines after [catalogue] path, the line of the bad value, what was given, the suggestion): each 1 or 2 edits away.
    [InlineData("[models]\nnames = [\"lcmd\"]", 4, "'lcmd'", "lcdm")]
    [InlineData("[models]\nnames = [\"lcdm\"]\nobservable = \"siz\"", 5, "'siz'", "size")]
    [InlineData("[models]\nnames = [\"lcdm\"]\n[models.lcmd]\nh0 = \"free\"", 5, "'models.lcmd'", "lcdm")]
    [InlineData("[models]\nnames = [\"lcdm\"]\n[survey]\nsize_errors = \"gausian\"", 6, "'gausian'", "gaussian")]
    [InlineData("[models]\nnames = [\"lcdm\"]\n[survey]\nevolution = \"binnd:3\"", 6, "'binnd:3'", "binned:3")]
    [InlineData("[models]\nnames = [\"lcdm\"]\n[survey]\nz_prior_shape = \"flt\"", 6, "'flt'", "flat")]
    [InlineData("[models]\nnames = [\"lcdm\"]\n[survey]\nz_marginal = \"linaer\"", 6, "'linaer'", "linear")]
    [InlineData("[models]\nnames = [\"lcdm\"]\n[survey]\nsize_relation = \"mas\"", 6, "'mas'", "mass")]
    [InlineData("[models]\nnames = [\"lcdm\"]\n[inference]\nsampler = \"mcm\"", 6, "'mcm'", "mcmc")]
    [InlineData("[models]\nnames = [\"lcdm\"]\n[parameters]\nomega_n = \"free\"", 6, "'omega_n'", "omega_m")]
    [InlineData("[models]\nnames = [\"lcdm\"]\n[report]\npaper = \"leter\"", 6, "'leter'", "letter")]
    [InlineData("[models]\nnames = [\"lcdm\"]\n[columns]\nthta = \"Re\"", 6, "'thta", "theta")]
    public void AMistypedValueOrNameGetsADidYouMeanAtItsLine(string lines, int line, string given, string suggestion)
    {
        var e = Assert.Throws<InputException>(() => Parse($"[catalogue]\npath = \"a.csv\"\n{lines}\n"));
        Assert.Equal("s.toml", e.File);
        Assert.Equal(line, e.Line);
        Assert.Contains(given, e.Message);
        Assert.Contains($"(did you mean '{suggestion}'?)", e.Message);
    }

    [Fact]
    public void ANumberWhereAWordIsExpectedIsNamed()
    {
        var e = Assert.Throws<InputException>(() => Parse("[catalogue]\npath = \"a.csv\"\n[models]\nnames = [\"lcdm\"]\n[survey]\nz_marginal = 3\n"));
        Assert.Contains("got 3", e.Message);
        Assert.DoesNotContain("did you mean", e.Message);
    }

    [Theory]
    [InlineData("[catalogue]\npath = \"a.csv\"\n[models]\nnames = [\"lcdm\"]\nobservable = \"size\"\n[selection]\nsb_limit = 24\n")] // SB cut without an SB model
    [InlineData("[catalogue]\npath = \"a.csv\"\n[models]\nnames = [\"lcdm\"]\n[columns]\nthetta = \"Re\"\n")]                          // unknown role
    [InlineData("[catalogue]\npath = \"a.csv\"\n[models]\nnames = [\"lcdm\"]\n[inference]\nsampler = \"gibbs\"\n")]
    [InlineData("[catalogue]\npath = \"a.csv\"\n[models]\nnames = [\"lcdm\"]\n[parameters]\nmu0 = \"free\"\n")]                        // not a size-model parameter
    [InlineData("[catalogue]\npath = \"a.csv\"\n[models]\nnames = [\"lcdm\"]\n[[report]]\ntitle = \"x\"\n")]
    [InlineData("[catalogue\npath = 1")]
    public void BadSettingsAreInputErrorsWithALine(string text)
    {
        var e = Assert.Throws<InputException>(() => Parse(text));
        Assert.NotNull(e.Line);
    }

    [Fact]
    public void DemoStudyParses()
    {
        var path = Path.Combine(RepoRoot(), "demo-catalogs", "demo-study.toml");
        var s = StudyFileParser.Load(path);
        Assert.Equal("demo", s.Name);
        Assert.True(File.Exists(s.CataloguePath));
        Assert.True(s.Synthetic);
    }

    internal static string RepoRoot()
    {
        for (var d = new DirectoryInfo(AppContext.BaseDirectory); d is not null; d = d.Parent)
            if (File.Exists(Path.Combine(d.FullName, "SizeTest.sln"))) return d.FullName;
        throw new InvalidOperationException("repository root not found");
    }
}

public sealed class ReadmeStudyExampleTests
{
    /// <summary>The study-file reference page (docs/study-file.md) holds the example.</summary>
    [Fact]
    public void TheReadmeExampleParsesAndItsCorrectionsAreValid()
    {
        var readme = File.ReadAllText(Path.Combine(StudyFileParserTests.RepoRoot(), "docs", "study-file.md"));
        int start = readme.IndexOf("```toml\n", StringComparison.Ordinal);
        Assert.True(start >= 0, "docs/study-file.md has a ```toml study example");
        start += "```toml\n".Length;
        var text = readme[start..readme.IndexOf("```", start, StringComparison.Ordinal)];
        var s = StudyFileParser.Parse(text, "study-file.md", "/data");
        Assert.Equal("my-study", s.Name);
        Assert.Equal(4, s.Models.Count);
        Assert.Equal(4, StudyHypotheses.Build(s).Count);
        SizeTest.Photometry.PhotometryOptionParser.Parse(s.Corrections, _ => "");
    }
}

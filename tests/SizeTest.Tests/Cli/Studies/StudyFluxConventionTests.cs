using System.Text.Json;
using SizeTest.Foundation.Errors;
using SizeTest.Studies;
using Xunit;

namespace SizeTest.Tests.Cli.Studies;

/// <summary>
/// The study file's <c>models.flux_convention</c> is fit's <c>--flux-convention</c>: identical results.json numbers, each static
/// model's convention in results.json and in the report's assumptions, and bad values named at their line (exit 2).
/// </summary>
public sealed class StudyFluxConventionTests : IDisposable
{
    private static readonly string Rows = Path.Combine(AppContext.BaseDirectory, "Reference", "Cosmology", "flux_convention_rows.csv");
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-flux-study-").FullName;

    public void Dispose()
    {
        try { Directory.Delete(_dir, true); } catch (IOException) { }
    }

    private static Dictionary<string, string> Numbers(JsonElement results)
    {
        // Every number of every model (free and fixed parameters, criteria, n) and the convention label, as written.
        var d = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var m in results.GetProperty("models").EnumerateArray())
        {
            string name = m.GetProperty("name").GetString()!;
            foreach (var key in new[] { "log_likelihood", "k", "n", "aic", "aicc", "bic", "flux_convention" })
                d[$"{name}.{key}"] = m.GetProperty(key).GetRawText();
            foreach (var p in m.GetProperty("parameters").EnumerateObject())
                d[$"{name}.{p.Name}"] = p.Value.GetRawText();
        }
        return d;
    }

    [Fact]
    public void TheStudyKeyGivesTheSameNumbersAsTheFlag()
    {
        File.Copy(Rows, Path.Combine(_dir, "rows.csv"));
        var fitOut = Path.Combine(_dir, "fit");
        var fit = CliRunner.Run("fit", Path.Combine(_dir, "rows.csv"), "--models", "lcdm,static-linear,tired-light", "--size-luminosity", "--abs-mag-range", "-22:-20",
            "--flux-convention", "time-dilation", "--starts", "1", "--cv-folds", "0", "--seed", "1", "--out", fitOut);
        Assert.True(fit.Exit == 0, fit.Err);
        File.WriteAllText(Path.Combine(_dir, "fc.toml"), """
            name = "fc"
            seed = 1
            [catalogue]
            path = "rows.csv"
            synthetic = true
            [models]
            names = ["lcdm", "static-linear", "tired-light"]
            observable = "size"
            flux_convention = "time-dilation"
            [survey]
            size_relation = "luminosity"
            abs_mag_range = [-22, -20]
            [inference]
            starts = 1
            [report]
            formats = ["html"]
            """);
        var runOut = Path.Combine(_dir, "run");
        var run = CliRunner.Run("run", Path.Combine(_dir, "fc.toml"), "--out", runOut);
        Assert.True(run.Exit == 0, run.Err);
        var a = Numbers(JsonDocument.Parse(File.ReadAllText(Path.Combine(fitOut, "results.json"))).RootElement);
        var b = Numbers(JsonDocument.Parse(File.ReadAllText(Path.Combine(runOut, "results.json"))).RootElement);
        Assert.Equal(a.Keys.Order(StringComparer.Ordinal), b.Keys.Order(StringComparer.Ordinal));
        foreach (var (k, v) in a) Assert.True(v == b[k], $"{k}: fit {v}, run {b[k]}");
        Assert.Equal("\"time-dilation\"", a["tired-light.flux_convention"]);
        Assert.Equal("null", a["lcdm.flux_convention"]);
        // The window's per-model counts are the reference script's (FluxConventionCliTests): 52 static-linear, 72 tired-light, 65 ΛCDM.
        Assert.Equal("52", a["static-linear.n"]);
        Assert.Equal("72", a["tired-light.n"]);

        // The report's assumptions state each static model's convention (report-data.json holds them as written in report.html).
        using var data = JsonDocument.Parse(File.ReadAllText(Path.Combine(runOut, "report-data.json")));
        var flux = data.RootElement.GetProperty("report").GetProperty("assumptions").EnumerateArray()
            .Single(x => x.GetProperty("topic").GetString() == "flux convention").GetProperty("statement").GetString()!;
        Assert.Contains("static linear (static-linear): time-dilation, D_L = d (1+z) (energy loss and a diluted arrival rate", flux, StringComparison.Ordinal);
        Assert.Contains("tired light (tired-light): time-dilation, D_L = d (1+z)", flux, StringComparison.Ordinal);
        Assert.Contains("bolometric SB dimming (1+z)^−2", flux, StringComparison.Ordinal);
        Assert.DoesNotContain("ΛCDM", flux, StringComparison.Ordinal);
    }

    [Fact]
    public void WithoutTheKeyTheReportStatesTheDefaultEnergyLoss()
    {
        var def = StudyFileParser.Parse("[catalogue]\npath = \"x.csv\"\n[models]\nnames = [\"static-linear\"]\n", "s.toml", _dir);
        Assert.Null(def.FluxConvention);
        Assert.Equal(0.5, StudyHypotheses.For(SizeTest.Cosmology.WorldModels.StaticLinear, def).Parameters.Single(p => p.Name == "luminosity_exponent").Value);
        var td = StudyFileParser.Parse("[catalogue]\npath = \"x.csv\"\n[models]\nnames = [\"static-linear\", \"lcdm\"]\nflux_convention = \"time-dilation\"\n", "s.toml", _dir);
        Assert.Equal(1.0, StudyHypotheses.For(SizeTest.Cosmology.WorldModels.StaticLinear, td).Parameters.Single(p => p.Name == "luminosity_exponent").Value);
        Assert.DoesNotContain(StudyHypotheses.For(SizeTest.Cosmology.WorldModels.LambdaCdm, td).Parameters, p => p.Name == "luminosity_exponent");
    }

    [Theory]
    [InlineData("names = [\"tired-light\"]\nflux_convention = \"sometimes\"", 5, "'models.flux_convention' must be \"energy-loss\" or \"time-dilation\"; got 'sometimes'")]
    [InlineData("names = [\"tired-light\"]\nflux_convention = \"Energy-Loss\"", 5, "'models.flux_convention' must be \"energy-loss\" or \"time-dilation\"; got 'Energy-Loss'")]
    [InlineData("names = [\"lcdm\", \"eds\"]\nflux_convention = \"time-dilation\"", 5, "models.flux_convention applies only to static world models (static-linear, tired-light); models.names lists lcdm, eds")]
    [InlineData("names = [\"tired-light\"]\nflux_convention = \"time-dilation\"\n[parameters]\nluminosity_exponent = 1", 7, "'parameters.luminosity_exponent' and 'models.flux_convention' (line 5) both set the static models' luminosity exponent; keep one")]
    [InlineData("names = [\"tired-light\"]\nflux_convention = \"time-dilation\"\n[models.tired-light]\nluminosity_exponent = \"free\"", 7, "'models.tired-light.luminosity_exponent' and 'models.flux_convention' (line 5) both set")]
    public void BadValuesNameTheirLine(string modelLines, int line, string expected)
    {
        string text = $"[catalogue]\npath = \"x.csv\"\n[models]\n{modelLines}\n";
        var e = Assert.Throws<InputException>(() => StudyFileParser.Parse(text, "s.toml", _dir));
        Assert.Contains(expected, e.Message, StringComparison.Ordinal);
        Assert.Equal(line, e.Line);
        Assert.Equal("s.toml", e.File);
        // Through the CLI: one line naming the file and line, exit 2.
        File.WriteAllText(Path.Combine(_dir, "bad.toml"), text);
        var (exit, _, err) = CliRunner.Run("run", Path.Combine(_dir, "bad.toml"), "--out", Path.Combine(_dir, "o"));
        Assert.Equal(2, exit);
        Assert.Contains($"bad.toml, line {line}", err, StringComparison.Ordinal);
        Assert.Contains(expected, err, StringComparison.Ordinal);
    }
}

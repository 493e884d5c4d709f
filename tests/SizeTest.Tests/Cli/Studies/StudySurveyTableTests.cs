using System.Text.Json;
using SizeTest.Foundation.Errors;
using SizeTest.Studies;
using Xunit;

namespace SizeTest.Tests.Cli.Studies;

/// <summary>
/// The study file's <c>[survey]</c> table is the same request as fit's survey options: a study and the equivalent
/// command line give identical results.json numbers (same likelihood, same optimiser path), and the table's keys
/// are checked like every other (bad values and settings that need another one name their line).
/// </summary>
public sealed class StudySurveyTableTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-survey-study-").FullName;

    public void Dispose()
    {
        try { Directory.Delete(_dir, true); } catch (IOException) { }
    }

    private string Mock()
    {
        // Synthetic: a magnitude-limited Schechter sample with R ∝ L^0.3 and two populations (labels in 'group').
        var cat = Path.Combine(_dir, "sv.csv");
        var r = CliRunner.Run("simulate", "--n", "300", "--seed", "8", "--luminosity-function", "schechter:-21:-1.2:-24:-16",
            "--size-lum-slope", "0.3", "--mag-limit", "24", "--population", "early:0.5:4:-1.3:0.3", "--population", "late:0.5:6:-0.8:0.3", "--out", cat);
        Assert.True(r.Exit == 0, r.Err);
        return cat;
    }

    private static Dictionary<string, double> Numbers(string resultsJson)
    {
        using var doc = JsonDocument.Parse(File.ReadAllText(resultsJson));
        var d = new Dictionary<string, double>(StringComparer.Ordinal);
        foreach (var m in doc.RootElement.GetProperty("models").EnumerateArray())
        {
            string name = m.GetProperty("name").GetString()!;
            d[$"{name}.log_likelihood"] = m.GetProperty("log_likelihood").GetDouble();
            foreach (var p in m.GetProperty("parameters").EnumerateObject())
                if (!p.Value.GetProperty("fixed").GetBoolean())
                {
                    d[$"{name}.{p.Name}"] = p.Value.GetProperty("value").GetDouble();
                    d[$"{name}.{p.Name}.lo"] = p.Value.GetProperty("lo").GetDouble();
                }
        }
        return d;
    }

    // Fits catalogue NAME.csv with fit's flags and runs the study NAME.toml ([survey] lines as given, the same models and observable,
    // seed 1, one start): the two results.json files' numbers, and the study's results text.
    private (Dictionary<string, double> Fit, Dictionary<string, double> Run, string RunText) FitAndRun(string name, string[] models, string observable,
        string[] flags, string surveyLines)
    {
        var fitOut = Path.Combine(_dir, "fit-" + name);
        var fit = CliRunner.Run(["fit", Path.Combine(_dir, name + ".csv"), "--models", string.Join(',', models), "--observable", observable, .. flags,
            "--starts", "1", "--cv-folds", "0", "--seed", "1", "--force", "--out", fitOut]);
        Assert.True(fit.Exit == 0, fit.Err);
        File.WriteAllText(Path.Combine(_dir, name + ".toml"), $"name = \"{name}\"\nseed = 1\n[catalogue]\npath = \"{name}.csv\"\nsynthetic = true\n" +
            $"[models]\nnames = [{string.Join(", ", models.Select(m => $"\"{m}\""))}]\nobservable = \"{observable}\"\n[survey]\n{surveyLines}\n" +
            "[inference]\nstarts = 1\n[report]\nformats = [\"html\"]\n");
        var runOut = Path.Combine(_dir, "run-" + name);
        var run = CliRunner.Run("run", Path.Combine(_dir, name + ".toml"), "--force", "--out", runOut);
        Assert.True(run.Exit == 0, run.Err);
        return (Numbers(Path.Combine(fitOut, "results.json")), Numbers(Path.Combine(runOut, "results.json")), File.ReadAllText(Path.Combine(runOut, "results.json")));
    }

    [Theory]
    [InlineData("size")]
    [InlineData("joint")]
    public void ASurveyTableGivesTheSameNumbersAsTheCommandLine(string observable)
    {
        Mock();
        var (a, b, _) = FitAndRun("sv", ["lcdm", "static-linear"], observable, ["--size-luminosity", "--group", "group", "--pivot-abs-mag", "-20.5"],
            "size_relation = \"luminosity\"\npivot_abs_mag = -20.5\ngroup = \"group\"");
        // Both must carry the per-group survey parameters (names NAME@GROUP) and β.
        Assert.Contains("lcdm.size_evolution@early", a.Keys);
        Assert.Contains("lcdm.size_luminosity_slope@late", a.Keys);
        if (observable == "joint") Assert.Contains("static-linear.sb_evolution@early", a.Keys); // each group's own b in joint fits
        Assert.Equal(a.Keys.Order(StringComparer.Ordinal), b.Keys.Order(StringComparer.Ordinal));
        foreach (var (k, v) in a) Assert.True(v == b[k], $"{k}: fit {v:R}, run {b[k]:R}");
    }

    [Fact]
    public void ZMarginalInTheSurveyTableIsFitsZMarginal()
    {
        var r = CliRunner.Run("simulate", "--n", "300", "--seed", "8", "--photoz-err", "0.05", "--z-dist", "uniform:0.3:2", "--out", Path.Combine(_dir, "pz.csv"));
        Assert.True(r.Exit == 0, r.Err);
        var (a, b, text) = FitAndRun("pz", ["lcdm"], "size", ["--z-marginal", "quadrature"], "z_marginal = \"quadrature\"");
        foreach (var (k, v) in a) Assert.True(v == b[k], $"{k}: fit {v:R}, run {b[k]:R}");
        Assert.Contains("-point Gauss", text, StringComparison.Ordinal);
        // Without the key the study takes fit's default, the linearised marginal, and its note names the study key.
        var (a2, b2, text2) = FitAndRun("pz", ["lcdm"], "size", [], "");
        foreach (var (k, v) in a2) Assert.True(v == b2[k], $"{k}: fit {v:R}, run {b2[k]:R}");
        Assert.Contains("linearised marginal (survey.z_marginal linear", text2, StringComparison.Ordinal);
        // survey.z_nodes is fit's --z-nodes.
        var (a3, b3, text3) = FitAndRun("pz", ["lcdm"], "size", ["--z-marginal", "quadrature", "--z-nodes", "11"], "z_marginal = \"quadrature\"\nz_nodes = 11");
        foreach (var (k, v) in a3) Assert.True(v == b3[k], $"{k}: fit {v:R}, run {b3[k]:R}");
        Assert.Contains("11-point Gauss", text3, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("size_relation = \"height\"", "'survey.size_relation' must be")]
    [InlineData("evolution = \"binned:1\"", "'survey.evolution' must be")]
    [InlineData("ref_cosmology = [70, 0.3]", "'survey.ref_cosmology' needs size_relation")]
    [InlineData("size_relation = \"mass\"\nabs_mag_range = [-23, -20]", "cannot be combined with size_relation = \"mass\"")]
    [InlineData("sise_errors = \"gaussian\"", "did you mean 'size_errors'")]
    [InlineData("z_marginal = \"cubic\"", "'survey.z_marginal' must be \"quadrature\" or \"linear\"")]
    [InlineData("z_prior_shape = \"bumpy\"", "'survey.z_prior_shape' must be \"population\" or \"flat\"")]
    [InlineData("z_nodes = 1", "'survey.z_nodes' must be a whole number of nodes, 2–40")]
    [InlineData("z_nodes = 7.5", "'survey.z_nodes' must be a whole number of nodes, 2–40")]
    public void BadSurveyKeysNameTheirPlace(string lines, string expected)
    {
        string text = $"[catalogue]\npath = \"x.csv\"\n[models]\nnames = [\"lcdm\"]\nobservable = \"size\"\n[survey]\n{lines}\n";
        var e = Assert.Throws<InputException>(() => StudyFileParser.Parse(text, "s.toml", _dir));
        Assert.Contains(expected, e.Message);
        Assert.True(e.Line >= 7, $"line {e.Line}");
    }

    [Fact]
    public void AGroupParameterForALabelTheSampleDoesNotHaveIsRefusedOnceLoaded()
    {
        Mock();
        File.WriteAllText(Path.Combine(_dir, "bad.toml"), """
            [catalogue]
            path = "sv.csv"
            [models]
            names = ["lcdm"]
            observable = "size"
            [parameters]
            "size_evolution@middle" = 0
            [survey]
            group = "group"
            """);
        var (exit, _, err) = CliRunner.Run("run", Path.Combine(_dir, "bad.toml"), "--out", Path.Combine(_dir, "o"));
        Assert.Equal(2, exit);
        Assert.Contains("'size_evolution@middle', which no model has for this sample", err);
        Assert.Contains("size_evolution@early", err);
    }
}

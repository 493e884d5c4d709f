using System.Globalization;
using System.Text.Json;
using Xunit;

namespace SizeTest.Tests.Cli;

/// <summary>
/// <c>--flux-convention</c> on every verb that computes luminosities or fits: <c>fit</c> and <c>power</c> apply it to every
/// static candidate (as <c>--fix luminosity_exponent=0.5|1</c>), <c>simulate</c>, <c>power</c> and <c>predict</c> to the static
/// <c>--model</c>; results.json names each static model's convention. Numbers against the closed forms and the hand values of
/// Reference/Cosmology/flux_conventions.py (FluxConventionTests derives each convention's exponent p in D_L = d (1+z)^p).
/// </summary>
public sealed class FluxConventionCliTests : IDisposable
{
    private static readonly string Rows = Path.Combine(AppContext.BaseDirectory, "Reference", "Cosmology", "flux_convention_rows.csv");
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-flux-").FullName;

    public void Dispose()
    {
        try { Directory.Delete(_dir, true); } catch (IOException) { }
    }

    private JsonElement Fit(string name, params string[] flags)
    {
        var outDir = Path.Combine(_dir, name);
        var r = CliRunner.Run(["fit", Rows, "--models", "lcdm,static-linear,tired-light", "--starts", "1", "--cv-folds", "0", .. flags, "--out", outDir]);
        Assert.True(r.Exit == 0, r.Err);
        return JsonDocument.Parse(File.ReadAllText(Path.Combine(outDir, "results.json"))).RootElement.Clone();
    }

    private static JsonElement Model(JsonElement results, string name) => results.GetProperty("models").EnumerateArray().Single(m => m.GetProperty("name").GetString() == name);

    private static double Value(JsonElement model, string parameter) => model.GetProperty("parameters").GetProperty(parameter).GetProperty("value").GetDouble();

    // "count MODEL CONVENTION N" lines of Reference/Cosmology/flux_convention_values.txt.
    private static int Count(string model, string convention) =>
        File.ReadAllLines(Path.Combine(AppContext.BaseDirectory, "Reference", "Cosmology", "flux_convention_values.txt"))
            .Select(l => l.Split(' ')).Where(f => f[0] == "count" && f[1] == model && f[2] == convention)
            .Select(f => int.Parse(f[3], CultureInfo.InvariantCulture)).Single();

    [Theory]
    [InlineData(null)]
    [InlineData("energy-loss")]
    [InlineData("time-dilation")]
    public void TheLuminosityWindowCountsEachModelsRowsWithItsConvention(string? convention)
    {
        // The window −22 ≤ M ≤ −20 with M = m − 5 log10(D_L/10 pc) from each model's D_L: the per-model n of results.json equals
        // the count of the reference script (astropy 5.2.1 for ΛCDM, D_L = d (1+z)^p for the static models); no flag is energy-loss.
        var results = Fit("window-" + (convention ?? "default"), convention is null ? ["--abs-mag-range", "-22:-20"] : ["--abs-mag-range", "-22:-20", "--flux-convention", convention]);
        string expected = convention ?? "energy-loss";
        foreach (var model in new[] { "static-linear", "tired-light", "lcdm" })
        {
            var m = Model(results, model);
            Assert.Equal(Count(model, expected), m.GetProperty("n").GetInt32());
            if (model == "lcdm") Assert.Equal(JsonValueKind.Null, m.GetProperty("flux_convention").ValueKind);
            else
            {
                Assert.Equal(expected, m.GetProperty("flux_convention").GetString());
                Assert.Equal(expected == "energy-loss" ? 0.5 : 1.0, Value(m, "luminosity_exponent"));
            }
        }
    }

    [Fact]
    public void WithTheSizeLuminosityRelationTheConventionMovesSizeEvolutionByMinusBeta()
    {
        // ln θ = ln R0 + β ln(L/L_p) + a ln(1+z) − ln d, and ln L = C + 2 ln d + 2p ln(1+z) (D_L = d (1+z)^p): the ln(1+z)
        // coefficient is a + 2βp, so the fit fixes a + 2βp and ln L̂ and β do not depend on p. Hence
        // a(p = 1) − a(p = 1/2) = −β exactly; the optimiser's tolerance allows 1e-4 (absolute) in a and β, 1e-6 in ln L̂.
        var el = Model(Fit("rel-el", "--size-luminosity"), "static-linear");
        var td = Model(Fit("rel-td", "--size-luminosity", "--flux-convention", "time-dilation"), "static-linear");
        double beta = Value(el, "size_luminosity_slope");
        Assert.InRange(beta, 0.1, 0.5); // the sample was drawn with R ∝ L^0.3
        Assert.Equal(beta, Value(td, "size_luminosity_slope"), 4);
        Assert.Equal(el.GetProperty("log_likelihood").GetDouble(), td.GetProperty("log_likelihood").GetDouble(), 6);
        Assert.Equal(Value(el, "size_evolution") - beta, Value(td, "size_evolution"), 4);
    }

    [Theory]
    [InlineData("--models lcdm,eds --flux-convention time-dilation", "--flux-convention applies only to static world models (static-linear, tired-light); --models lists lcdm, eds")]
    [InlineData("--models tired-light --flux-convention time-dilation --fix luminosity_exponent=1", "--flux-convention time-dilation sets luminosity_exponent = 1 for every static model; give either it or luminosity_exponent in --fix, --free, --prior or --bound, not both")]
    [InlineData("--models tired-light --flux-convention energy-loss --free luminosity_exponent", "give either it or luminosity_exponent in --fix, --free, --prior or --bound")]
    [InlineData("--models tired-light --flux-convention sometimes", "--flux-convention must be energy-loss or time-dilation; got 'sometimes'")]
    public void FitRefusesAConventionItCannotApply(string flags, string expected)
    {
        var r = CliRunner.Run(["fit", Rows, .. flags.Split(' '), "--out", Path.Combine(_dir, "bad")]);
        Assert.Equal(2, r.Exit);
        Assert.Contains(expected, r.Err, StringComparison.Ordinal);
        Assert.False(Directory.Exists(Path.Combine(_dir, "bad")));
    }

    [Fact]
    public void SimulateWritesMagnitudesWithTheConventionsLuminosityDistance()
    {
        // Same seed, no cuts: the same objects; m = M + 5 log10(D_L/10 pc) with D_L = d (1+z)^p, so
        // m(p = 1) − m(p = 1/2) = 2.5 log10(1+z) for every object (closed form; 1e-9 mag for the CSV's round trip of ~17 digits).
        string[] Draw(string convention)
        {
            var path = Path.Combine(_dir, $"sim-{convention}.csv");
            var r = CliRunner.Run("simulate", "--model", "static-linear", "--flux-convention", convention, "--n", "50", "--seed", "4",
                "--luminosity-function", "schechter:-21:-1.2:-24:-16", "--z-dist", "uniform:0.2:2", "--out", path);
            Assert.True(r.Exit == 0, r.Err);
            return File.ReadAllLines(path);
        }
        var el = Draw("energy-loss");
        var td = Draw("time-dilation");
        var header = el[0].Split(',');
        int iz = Array.IndexOf(header, "z"), im = Array.IndexOf(header, "mag");
        Assert.Equal(51, el.Length);
        for (int i = 1; i < el.Length; i++)
        {
            var a = el[i].Split(',');
            var b = td[i].Split(',');
            double z = double.Parse(a[iz], CultureInfo.InvariantCulture);
            Assert.Equal(a[iz], b[iz]);
            double shift = double.Parse(b[im], CultureInfo.InvariantCulture) - double.Parse(a[im], CultureInfo.InvariantCulture);
            Assert.True(Math.Abs(shift - 2.5 * Math.Log10(1 + z)) < 1e-9, $"row {i}: {shift:R} vs {2.5 * Math.Log10(1 + z):R}");
        }
    }

    [Fact]
    public void PowerAppliesTheConventionToTheStaticCandidates()
    {
        // True ΛCDM: the convention sets the static candidate's luminosity exponent (and so its dimming n = 2p in the joint fits),
        // not the truth's. The ΛCDM candidate's BIC is the same under both; tired light's differs.
        Dictionary<string, string> Bic(string convention)
        {
            var outDir = Path.Combine(_dir, "power-" + convention);
            var r = CliRunner.Run("power", "--model", "lcdm", "--flux-convention", convention, "--models", "lcdm,tired-light", "--n", "150",
                "--mocks", "2", "--seed", "3", "--threads", "1", "--out", outDir);
            Assert.True(r.Exit == 0, r.Err);
            var lines = File.ReadAllLines(Path.Combine(outDir, "mocks.csv"));
            var h = lines[0].Split(',');
            var first = lines[1].Split(',');
            return h.Zip(first).Where(p => p.First.StartsWith("bic_", StringComparison.Ordinal)).ToDictionary(p => p.First, p => p.Second);
        }
        var el = Bic("energy-loss");
        var td = Bic("time-dilation");
        Assert.Equal(el["bic_lcdm"], td["bic_lcdm"]);
        Assert.NotEqual(el["bic_tired-light"], td["bic_tired-light"]);
        // With only FLRW models nothing takes it.
        var bad = CliRunner.Run("power", "--model", "lcdm", "--flux-convention", "time-dilation", "--models", "lcdm", "--n", "150", "--mocks", "2", "--seed", "3", "--out", Path.Combine(_dir, "bad"));
        Assert.Equal(2, bad.Exit);
        Assert.Contains("--flux-convention applies only to static world models (static-linear, tired-light); --models lists lcdm", bad.Err, StringComparison.Ordinal);
    }
}

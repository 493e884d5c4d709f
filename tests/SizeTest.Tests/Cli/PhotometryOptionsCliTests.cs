using System.Globalization;
using System.Text;
using System.Text.Json;
using SizeTest.Tests.Inference;
using Xunit;
using SizeTest.Foundation.Angles;

namespace SizeTest.Tests.Cli;

/// <summary>The photometry options of <c>fit</c> and <c>inspect</c> (<see cref="SizeTest.Cli.PhotometryCliOptions"/>).</summary>
public sealed class PhotometryOptionsCliTests : IDisposable
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;
    private readonly string _dir = Path.Combine(Path.GetTempPath(), "sizetest-photcli-" + Guid.NewGuid().ToString("N"));

    public PhotometryOptionsCliTests() => Directory.CreateDirectory(_dir);

    public void Dispose()
    {
        try { Directory.Delete(_dir, true); } catch (IOException) { }
    }

    /// <summary>A synthetic (mock) SB catalogue: EdS, μ0 = 21, b = 1, 0.3 mag scatter (MockCatalogue).</summary>
    private string WriteSbCatalogue(int n = 400)
    {
        var obs = MockCatalogue.Draw(TestWorldModels.Eds.Create(new Dictionary<string, double>()), n, new MockCatalogue.Truth(), seed: 5);
        var sb = new StringBuilder("# synthetic mock catalogue for tests\nid,z,theta_arcsec,mu,mu_err\n");
        for (int i = 0; i < obs.Count; i++)
            sb.Append(Inv, $"g{i},{obs.Z[i]:R},{Math.Exp(obs.LnTheta![i]) * AngleUnits.ArcsecPerRadian:R},{obs.Mu![i]:R},0.1\n");
        var path = Path.Combine(_dir, "sb.csv");
        File.WriteAllText(path, sb.ToString());
        return path;
    }

    private static readonly string[] SbCols = ["--col", "z=z", "--col", "mu=mu", "--col", "mu_err=mu_err"];

    private static double SbEvolution(string outDir)
    {
        using var doc = JsonDocument.Parse(File.ReadAllText(Path.Combine(outDir, "results.json")));
        return doc.RootElement.GetProperty("models")[0].GetProperty("parameters").GetProperty("sb_evolution").GetProperty("value").GetDouble();
    }

    [Fact]
    public void FitKCorrectionPowerLawShiftsSbEvolutionByOnePlusAlpha()
    {
        var cat = WriteSbCatalogue();
        string none = Path.Combine(_dir, "none"), pl = Path.Combine(_dir, "pl");
        string[] common = ["fit", cat, .. SbCols, "--models", "eds", "--observable", "sb", "--cv-folds", "0"];
        var r0 = CliRunner.Run([.. common, "--out", none]);
        Assert.True(r0.Exit == 0, r0.Err);
        var r1 = CliRunner.Run([.. common, "--kcorr", "powerlaw:0.5", "--out", pl]);
        Assert.True(r1.Exit == 0, r1.Err);
        // Closed form (derived): the model is μ = μ0 + 2.5 (n − b) log10(1+z) + K with K = −2.5 (1+α) log10(1+z) for
        // f_ν ∝ ν^α (Hogg et al. 2002). K is a pure log10(1+z) term, so the same data are fitted by b' = b − (1+α),
        // with μ0 and the residuals unchanged: for α = 0.5 the fitted sb_evolution moves by exactly −1.5.
        // Tolerance 1e-3 absolute: far above the optimiser's (relative ln L tolerance 1e-10 ⇒ Δb ~ 1e-5), far below the shift.
        Assert.InRange(SbEvolution(pl) - SbEvolution(none), -1.5 - 1e-3, -1.5 + 1e-3);
        // The correction is reported: as a note in the table and in results.json.
        Assert.Contains("note: photometry: K-correction: power law", r1.Out);
        using var doc = JsonDocument.Parse(File.ReadAllText(Path.Combine(pl, "results.json")));
        var notes = doc.RootElement.GetProperty("notes").EnumerateArray().Select(x => x.GetString()!).ToArray();
        Assert.Contains(notes, n => n.StartsWith("photometry: K-correction: power law f_nu ~ nu^0.5", StringComparison.Ordinal));
        using var doc0 = JsonDocument.Parse(File.ReadAllText(Path.Combine(none, "results.json")));
        Assert.Contains(doc0.RootElement.GetProperty("notes").EnumerateArray(), x => x.GetString()!.StartsWith("photometry: K-correction: none", StringComparison.Ordinal));
    }

    [Fact]
    public void InspectListsTheCorrectionsThatWillBeApplied()
    {
        var cat = WriteSbCatalogue(50);
        var (exit, stdout, err) = CliRunner.Run(["inspect", cat, .. SbCols, "--kcorr", "powerlaw:0"]);
        Assert.True(exit == 0, err);
        int at = stdout.IndexOf("corrections that will be applied:", StringComparison.Ordinal);
        Assert.True(at >= 0, stdout);
        Assert.Contains("K-correction: power law f_nu ~ nu^0, same band", stdout[at..]);
        var json = CliRunner.Run(["inspect", cat, .. SbCols, "--kcorr", "powerlaw:0", "--format", "json"]);
        Assert.Equal(0, json.Exit);
        using var doc = JsonDocument.Parse(json.Out);
        var corr = doc.RootElement.GetProperty("corrections").EnumerateArray().Select(x => x.GetString()!).ToArray();
        Assert.Contains(corr, c => c.StartsWith("K-correction: power law", StringComparison.Ordinal));
        // Without options: the default statement.
        var plain = CliRunner.Run(["inspect", cat, .. SbCols, "--format", "json"]);
        using var doc2 = JsonDocument.Parse(plain.Out);
        Assert.StartsWith("K-correction: none", doc2.RootElement.GetProperty("corrections")[0].GetString());
    }

    [Theory]
    [InlineData("--kcorr", "powerlaw:abc")]
    [InlineData("--kcorr", "bogus")]
    [InlineData("--sersic-n", "99")]
    [InlineData("--extinction", "ebv:EBV")]
    [InlineData("--sb", "sideways")]
    [InlineData("--zero-points", "no-such-file.txt")]
    public void BadPhotometryOptionExitsTwoWithOneLine(string option, string value)
    {
        var cat = WriteSbCatalogue(30);
        var outDir = Path.Combine(_dir, "bad");
        var fit = CliRunner.Run(["fit", cat, .. SbCols, "--models", "eds", "--observable", "sb", option, value, "--out", outDir]);
        Assert.Equal(2, fit.Exit);
        Assert.Single(fit.Err.Split('\n', StringSplitOptions.RemoveEmptyEntries));
        Assert.Contains(option == "--zero-points" ? "no-such-file.txt" : option, fit.Err); // names the option (or the missing file)
        Assert.False(Directory.Exists(outDir)); // nothing written
        var inspect = CliRunner.Run(["inspect", cat, .. SbCols, option, value]);
        Assert.Equal(2, inspect.Exit);
        Assert.Single(inspect.Err.Split('\n', StringSplitOptions.RemoveEmptyEntries));
    }

    /// <summary>The isophotal mock of <see cref="IsophotalLikelihoodTests"/> as a CSV catalogue.</summary>
    private string WriteIsophotalCatalogue(int n)
    {
        var mock = IsophotalLikelihoodTests.Draw(n, seed: 21).Isophotal;
        var sb = new StringBuilder("# synthetic isophotal mock catalogue for tests (isophote 26 mag/arcsec2, Sersic n = 1)\nid,z,theta_iso_arcsec,theta_err_arcsec,mu_e,mu_err\n");
        for (int i = 0; i < mock.Count; i++)
        {
            double th = Math.Exp(mock.LnTheta![i]) * AngleUnits.ArcsecPerRadian;
            sb.Append(Inv, $"g{i},{mock.Z[i]:R},{th:R},{0.05 * th:R},{mock.Mu![i]:R},0.05\n");
        }
        var path = Path.Combine(_dir, "iso.csv");
        File.WriteAllText(path, sb.ToString());
        return path;
    }

    [Fact]
    public void FitIsophotalCatalogueThroughTheCommandLine()
    {
        var cat = WriteIsophotalCatalogue(1500);
        string[] cols = ["--col", "z=z", "--col", "theta=theta_iso_arcsec:arcsec", "--col", "theta_err=theta_err_arcsec:arcsec", "--col", "mu=mu_e", "--col", "mu_err=mu_err",
            "--size-def", "isophotal:26", "--models", "eds", "--cv-folds", "0"];
        // Size alone cannot predict isophotal radii: a clear input error.
        var size = CliRunner.Run(["fit", cat, .. cols, "--sersic-n", "1", "--out", Path.Combine(_dir, "s")]);
        Assert.Equal(2, size.Exit);
        Assert.Contains("--observable joint", size.Err);
        // Isophotal without a Sérsic index: the photometry stage asks for it.
        var noN = CliRunner.Run(["fit", cat, .. cols, "--observable", "joint", "--out", Path.Combine(_dir, "n")]);
        Assert.Equal(2, noN.Exit);
        Assert.Contains("--sersic-n", noN.Err);
        var outDir = Path.Combine(_dir, "iso");
        var ok = CliRunner.Run(["fit", cat, .. cols, "--observable", "joint", "--sersic-n", "1", "--out", outDir]);
        Assert.True(ok.Exit == 0, ok.Err);
        Assert.Contains("note: photometry: sizes are isophotal at 26", ok.Out);
        using var doc = JsonDocument.Parse(File.ReadAllText(Path.Combine(outDir, "results.json")));
        var a = doc.RootElement.GetProperty("models")[0].GetProperty("parameters").GetProperty("size_evolution");
        double v = a.GetProperty("value").GetDouble(), lo = a.GetProperty("lo").GetDouble(), hi = a.GetProperty("hi").GetDouble();
        Assert.InRange(-1.0, v - 1.5 * (hi - lo), v + 1.5 * (hi - lo)); // injected a = −1 within 3σ (lo/hi are ±1σ)
        // inspect shows the isophotal assumption among the corrections.
        var ins = CliRunner.Run(["inspect", cat, "--col", "z=z", "--col", "theta=theta_iso_arcsec:arcsec", "--col", "mu=mu_e", "--size-def", "isophotal:26", "--sersic-n", "1"]);
        Assert.Equal(0, ins.Exit);
        Assert.Contains("sizes are isophotal at 26", ins.Out);
        // Without --sersic-n, inspect still reads the catalogue and lists why the corrections cannot be applied.
        var insNoN = CliRunner.Run(["inspect", cat, "--col", "z=z", "--col", "theta=theta_iso_arcsec:arcsec", "--size-def", "isophotal:26"]);
        Assert.Equal(0, insNoN.Exit);
        Assert.Contains("cannot be applied as given", insNoN.Out);
    }
}

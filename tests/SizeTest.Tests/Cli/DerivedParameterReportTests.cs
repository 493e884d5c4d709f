using System.Text.Json;
using Xunit;

namespace SizeTest.Tests.Cli;

public sealed class DerivedParameterReportTests
{
    [Fact]
    public void FlatLcdmReportsTheDerivedOmegaLambdaAndStaticModelsTheirDimmingExponent()
    {
        var dir = Directory.CreateTempSubdirectory("sizetest-derived-").FullName;
        var cat = Path.Combine(dir, "mock.csv");
        var (s, _, serr) = CliRunner.Run("simulate", "--model", "lcdm", "--n", "300", "--seed", "5", "--out", cat);
        Assert.True(s == 0, serr);
        var outDir = Path.Combine(dir, "fit");
        var (f, _, ferr) = CliRunner.Run("fit", cat, "--models", "lcdm,tired-light", "--observable", "size", "--cv-folds", "0", "--out", outDir);
        Assert.True(f is 0 or 1, ferr);
        using var doc = JsonDocument.Parse(File.ReadAllText(Path.Combine(outDir, "results.json")));
        var models = doc.RootElement.GetProperty("models").EnumerateArray().ToDictionary(m => m.GetProperty("name").GetString()!);
        // Flat ΛCDM without radiation: ΩΛ = 1 − Ωm = 0.7 (closed form; "not given" means flat).
        var ol = models["lcdm"].GetProperty("parameters").GetProperty("omega_lambda");
        Assert.Equal(0.7, ol.GetProperty("value").GetDouble(), 12);
        Assert.True(ol.GetProperty("fixed").GetBoolean());
        // Static models: the dimming exponent defaults to 2q with q = 0.5 (energy loss only), i.e. 1.
        var n = models["tired-light"].GetProperty("parameters").GetProperty("dimming_exponent");
        Assert.Equal(1.0, n.GetProperty("value").GetDouble(), 12);
    }
}

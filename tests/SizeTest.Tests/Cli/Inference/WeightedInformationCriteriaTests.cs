using System.Text.Json;
using SizeTest.Tests.Catalogues;
using Xunit;

namespace SizeTest.Tests.Cli.Inference;

/// <summary>
/// A weight column counts as frequency weights (InformationCriteria's remarks): every object at weight 2 must give the
/// fit, AICc and BIC of the same catalogue with every row written twice, and BIC = k ln(Σ w) − 2 ln L̂ by hand
/// (Schwarz 1978 with n = Σ w = 600 for 300 objects).
/// </summary>
public sealed class WeightedInformationCriteriaTests : IDisposable
{
    private readonly TempFiles _t = new();

    public void Dispose() => _t.Dispose();

    private static JsonElement[] Models(string dir) =>
        JsonDocument.Parse(File.ReadAllText(Path.Combine(dir, "results.json"))).RootElement.GetProperty("models").EnumerateArray().ToArray();

    [Fact]
    public void WeightTwoIsTheSampleWrittenTwice()
    {
        string mock = _t.PathOf("mock.csv");
        var (code, _, err) = CliRunner.Run("simulate", "--n", "300", "--seed", "4", "--out", mock);
        Assert.True(code == 0, err);
        var lines = File.ReadAllLines(mock);
        string weighted = _t.Write("weighted.csv", string.Join("\n", [lines[0] + ",weight", .. lines.Skip(1).Select(l => l + ",2")]) + "\n");
        string twice = _t.Write("twice.csv", string.Join("\n", [lines[0], .. lines.Skip(1), .. lines.Skip(1)]) + "\n");
        string Fit(string csv)
        {
            string dir = _t.PathOf(Path.GetFileNameWithoutExtension(csv));
            var (c, _, e) = CliRunner.Run("fit", csv, "--models", "lcdm,tired-light", "--cv-folds", "0", "--starts", "1", "--out", dir);
            Assert.True(c == 0, e);
            return dir;
        }
        string wDir = Fit(weighted), tDir = Fit(twice);
        var w = Models(wDir);
        var t = Models(tDir);
        for (int m = 0; m < 2; m++)
        {
            double lnL = w[m].GetProperty("log_likelihood").GetDouble();
            int k = w[m].GetProperty("k").GetInt32();
            Assert.Equal(300, w[m].GetProperty("n").GetInt32());
            Assert.Equal(k * Math.Log(600) - 2 * lnL, w[m].GetProperty("bic").GetDouble(), 1e-9);
            // Same maximum as the doubled sample (the optimiser stops within its tolerance: 1e-6 in ln L is far inside it).
            Assert.Equal(t[m].GetProperty("log_likelihood").GetDouble(), lnL, 1e-6);
            Assert.Equal(t[m].GetProperty("bic").GetDouble(), w[m].GetProperty("bic").GetDouble(), 1e-6);
            Assert.Equal(t[m].GetProperty("aicc").GetDouble(), w[m].GetProperty("aicc").GetDouble(), 1e-6);
        }
        var notes = JsonDocument.Parse(File.ReadAllText(Path.Combine(wDir, "results.json"))).RootElement.GetProperty("notes").EnumerateArray().Select(n => n.GetString()!);
        Assert.Contains(notes, n => n.StartsWith("weights: the fit maximises Σ w ln p; AICc and BIC take n = Σ w = 600", StringComparison.Ordinal));
    }
}

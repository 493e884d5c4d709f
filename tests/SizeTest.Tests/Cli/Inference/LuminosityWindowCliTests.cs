using System.Text.Json;
using SizeTest.Tests.Catalogues;
using Xunit;

namespace SizeTest.Tests.Cli.Inference;

/// <summary>
/// <c>--abs-mag-range</c> through the CLI on a committed mock whose first row lies outside the window: the window keeps the objects
/// astropy keeps (Reference/Inference/window_count.py → window_count.txt: 236 of 800 under ΛCDM, 206 under static-linear), and
/// models fitted to different objects are not ranked.
/// </summary>
public sealed class LuminosityWindowCliTests : IDisposable
{
    private readonly TempFiles _t = new();

    public void Dispose() => _t.Dispose();

    private static readonly string Mock = Path.Combine(AppContext.BaseDirectory, "Reference", "Inference", "window_mock.csv");

    [Fact]
    public void AWindowThatExcludesTheFirstRowKeepsTheObjectsInsideItAndWithholdsTheVerdict()
    {
        // The CLI checks the columns on one object first; that object (row 1, M = −18.75 under ΛCDM) lies outside [−22, −20] and used
        // to stop the fit with "no object of the sample lies in --abs-mag-range".
        string dir = _t.PathOf("fit");
        var (code, _, err) = CliRunner.Run("fit", Mock, "--size-luminosity", "--abs-mag-range", "-22:-20", "--models", "lcdm,static-linear",
            "--cv-folds", "0", "--starts", "1", "--out", dir);
        Assert.True(code == 0, err);
        var results = JsonDocument.Parse(File.ReadAllText(Path.Combine(dir, "results.json"))).RootElement;
        var notes = results.GetProperty("notes").EnumerateArray().Select(n => n.GetString()!).ToList();
        Assert.Contains(notes, n => n.Contains("236 of 800 objects", StringComparison.Ordinal) && n.Contains("lcdm", StringComparison.Ordinal));
        Assert.Contains(notes, n => n.Contains("206 of 800 objects", StringComparison.Ordinal) && n.Contains("static-linear", StringComparison.Ordinal));
        // 236 and 206 objects: the likelihoods are over different data, so no ranking (before: "very strong", ΔBIC = 53.9).
        var verdict = results.GetProperty("verdict");
        Assert.False(verdict.GetProperty("decided").GetBoolean());
        Assert.Equal(JsonValueKind.Null, verdict.GetProperty("best").ValueKind);
        Assert.Contains("different objects", verdict.GetProperty("reason").GetString()!, StringComparison.Ordinal);
        // Each model's n is the objects its own window keeps (astropy: 236 and 206), and its BIC and AICc take that n:
        // BIC = −2 ln L + k ln n (Schwarz 1978), AICc = AIC + 2k(k+1)/(n − k − 1) (Hurvich & Tsai 1989).
        foreach (var (model, kept) in new[] { ("lcdm", 236), ("static-linear", 206) })
        {
            var m = results.GetProperty("models").EnumerateArray().Single(x => x.GetProperty("name").GetString() == model);
            Assert.Equal(kept, m.GetProperty("n").GetInt32());
            double lnL = m.GetProperty("log_likelihood").GetDouble();
            int k = m.GetProperty("k").GetInt32();
            Assert.Equal(-2 * lnL + k * Math.Log(kept), m.GetProperty("bic").GetDouble(), 6);
            Assert.Equal(-2 * lnL + 2 * k + 2.0 * k * (k + 1) / (kept - k - 1), m.GetProperty("aicc").GetDouble(), 6);
        }
    }

    [Fact]
    public void AWindowThatKeepsNoObjectIsStillRefused()
    {
        var (code, _, err) = CliRunner.Run("fit", Mock, "--size-luminosity", "--abs-mag-range", "-40:-30", "--models", "lcdm", "--cv-folds", "0", "--out", _t.PathOf("none"));
        Assert.Equal(2, code);
        Assert.Contains("no object of the sample lies in --abs-mag-range", err, StringComparison.Ordinal);
    }
}

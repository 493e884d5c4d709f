using System.Text.Json;
using SizeTest.Inference;
using SizeTest.Tests.Catalogues;
using Xunit;

namespace SizeTest.Tests.Cli.Inference;

/// <summary>
/// Compact radio sources, ℓ = ℓ_m (L/L_pivot)^β (1+z)^n (Gurvits, Kellermann &amp; Frey 1999), on a committed mock of 600 sources
/// (simulate --kind radio --n 600 --seed 9 --lum-exponent 0.1 --z-dist uniform:0.4:2.8: ℓ_m = 11.03 pc, Cao et al. 2017). Reference:
/// Reference/Inference/radio_lm_ml.py (scipy 1.10.1 / astropy 5.2.1, flat ΛCDM) → radio_lm_ml.txt: ln L 44.4172, ℓ_m = 10.8949 ± 0.3394 pc,
/// n = 0.0154 ± 0.0325. Found here: ℓ_m ≈ 0.010 kpc lay within 10⁻⁶ of r0_kpc's range (10⁻⁴–10⁴ kpc) of its lower bound, so three of the
/// four models called it "at its lower bound" with an interval down to 10⁻⁴ kpc, and left it out of the Hessian, which shrank n's
/// interval (tired light ± 0.014 instead of ± 0.033).
/// </summary>
public sealed class RadioLinearSizeCliTests : IDisposable
{
    private readonly TempFiles _t = new();

    public void Dispose() => _t.Dispose();

    private static readonly string Mock = Path.Combine(AppContext.BaseDirectory, "Reference", "Inference", "radio_mock_600.csv");

    [Fact]
    public void TheLinearSizeIsFittedAwayFromItsBoundInEveryModelAndShownInParsecs()
    {
        string dir = _t.PathOf("fit");
        var (code, stdout, err) = CliRunner.Run("fit", Mock, "--size-luminosity", "--frequency-ghz", "2.29", "--cv-folds", "0", "--out", dir);
        Assert.True(code == 0, err);
        var root = JsonDocument.Parse(File.ReadAllText(Path.Combine(dir, "results.json"))).RootElement;
        Assert.True(root.GetProperty("settings").GetProperty("compact_radio_sources").GetBoolean());
        foreach (var m in root.GetProperty("models").EnumerateArray())
        {
            var r0 = m.GetProperty("parameters").GetProperty("r0_kpc");
            Assert.Equal(JsonValueKind.Null, r0.GetProperty("at_bound").ValueKind);
            Assert.True(r0.GetProperty("lo").GetDouble() > 0.009, $"{m.GetProperty("name")}: lo {r0.GetProperty("lo")}");
            var n = m.GetProperty("parameters").GetProperty("size_evolution");
            double half = 0.5 * (n.GetProperty("hi").GetDouble() - n.GetProperty("lo").GetDouble());
            Assert.InRange(half, 0.025, 0.045); // every model: about the reference's ± 0.0325, never the ± 0.014 of the bound bug
        }
        var lcdm = root.GetProperty("models").EnumerateArray().Single(m => m.GetProperty("name").GetString() == "lcdm");
        Assert.Equal(44.4172, lcdm.GetProperty("log_likelihood").GetDouble(), 3);
        var p = lcdm.GetProperty("parameters").GetProperty("r0_kpc");
        Assert.Equal(10.8949, 1000 * p.GetProperty("value").GetDouble(), 2);
        Assert.Equal(0.3394, 1000 * 0.5 * (p.GetProperty("hi").GetDouble() - p.GetProperty("lo").GetDouble()), 2);
        var ne = lcdm.GetProperty("parameters").GetProperty("size_evolution");
        Assert.Equal(0.0154, ne.GetProperty("value").GetDouble(), 3);
        // People read ℓ_m in pc (ParameterDisplay); results.json keeps r0_kpc in kpc.
        Assert.Contains("lcdm: ℓ_m = 10.89 ± 0.34 pc", stdout, StringComparison.Ordinal);
    }

    [Theory]
    // OnBound: 10⁻⁶ of the range and of the value's own size (MaximumLikelihood). Closed cases.
    [InlineData(0.0001, 1e-4, 1e4, true)]     // exactly on the lower bound (the projection's clamp)
    [InlineData(0.0099, 1e-4, 1e4, false)]    // ℓ_m ≈ 10 pc: 0.0098 from the bound, 10⁶ times its own size's tolerance
    [InlineData(0.0, 0.0, 1.0, true)]
    [InlineData(0.5, 0.0, 1.0, false)]
    [InlineData(1.0 - 1e-9, 0.0, 1.0, true)]  // within 10⁻⁶ of range and of the value
    public void OnBoundNeedsTheParameterOnTheBoundNotJustCloseOnAWideRange(double x, double min, double max, bool expected) =>
        Assert.Equal(expected, MaximumLikelihood.OnBound(x, min, max));
}

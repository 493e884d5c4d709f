using System.Text.Json;
using SizeTest.Tests.Catalogues;
using Xunit;

namespace SizeTest.Tests.Cli.Inference;

/// <summary>
/// Photometric redshifts under a stated prior that cuts the data: each object whose redshift normal the prior cuts is integrated
/// under its truncated normal by Gauss–Legendre. Mock: <c>simulate --n 400 --seed 7 --photoz-err 0.08 --z-dist uniform:0.5:3</c>
/// (Reference/Inference/photoz_truncated_prior_mock.csv), fitted with ΛCDM, Ωm = 0.3, a flat prior on [1, 2.5] and the quadrature
/// marginal. Reference: Reference/Inference/photoz_truncated_prior.py (scipy 1.10.1 adaptive <c>quad</c> of each object's integral,
/// astropy 5.2.1 distances) → photoz_truncated_prior.txt: ln L −281.809672, r0 8.653611 kpc, a −1.527897, scatter 0.208019 dex.
/// Found here: dropping the Hermite nodes outside the prior and renormalising gave a = −1.5531 (20 nodes) and −1.5387 (40 nodes),
/// ln L −282.39 and −282.20.
/// </summary>
public sealed class TruncatedPriorQuadratureCliTests : IDisposable
{
    private readonly TempFiles _t = new();

    public void Dispose() => _t.Dispose();

    private static readonly string Mock = Path.Combine(AppContext.BaseDirectory, "Reference", "Inference", "photoz_truncated_prior_mock.csv");

    [Theory]
    [InlineData("20", 1e-4)]
    [InlineData("7", 5e-4)] // the default node count of size fits: within 2·10⁻³ of the interval's half-width (0.128)
    public void ACuttingPriorIsIntegratedUnderEachObjectsTruncatedNormal(string nodes, double tolerance)
    {
        string dir = _t.PathOf("fit" + nodes);
        var (code, _, err) = CliRunner.Run("fit", Mock, "--models", "lcdm", "--fix", "omega_m=0.3", "--z-prior", "1.0:2.5",
            "--z-prior-shape", "flat", "--z-marginal", "quadrature", "--z-nodes", nodes, "--cv-folds", "0", "--out", dir);
        Assert.True(code == 0, err);
        var m = JsonDocument.Parse(File.ReadAllText(Path.Combine(dir, "results.json"))).RootElement.GetProperty("models")[0];
        var p = m.GetProperty("parameters");
        Assert.Equal(-1.527897, p.GetProperty("size_evolution").GetProperty("value").GetDouble(), tolerance);
        Assert.Equal(8.653611, p.GetProperty("r0_kpc").GetProperty("value").GetDouble(), 100 * tolerance);
        Assert.Equal(0.208019, p.GetProperty("scatter_dex").GetProperty("value").GetDouble(), tolerance);
        Assert.Equal(-281.809672, m.GetProperty("log_likelihood").GetDouble(), 1000 * tolerance);
    }
}

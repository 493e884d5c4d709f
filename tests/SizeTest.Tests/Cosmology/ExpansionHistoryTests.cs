using SizeTest.Cosmology;
using Xunit;

namespace SizeTest.Tests.Cosmology;

public sealed class ExpansionHistoryTests
{
    [Theory]
    // Ωm = 0.3, ΩΛ = 2: E²(z) = 0.3y³ − 1.3y² + 2 has a zero at y ≈ 1.55 (bounce; closed form of the cubic, derived here).
    [InlineData("lcdm", 0.3, 2.0, -1.0)]
    // Ωm = 0, ΩΛ = 1.2: E² = −0.2y² + 1.2 vanishes at y = √6 (no matter to stop it).
    [InlineData("lcdm", 0.0, 1.2, -1.0)]
    [InlineData("wcdm", 0.3, 2.0, -1.0)]
    [InlineData("w0wacdm", 0.3, 2.0, -1.0)]
    public void ParameterSetsWithoutABigBangAreRefusedWithAClearMessage(string model, double om, double ol, double w0)
    {
        var family = WorldModels.Get(model);
        var values = new Dictionary<string, double> { ["omega_m"] = om, ["omega_lambda"] = ol };
        if (model != "lcdm") values["w0"] = w0;
        var ex = Assert.Throws<ArgumentException>(() => family.Create(values));
        Assert.Contains("no big bang", ex.Message);
        Assert.DoesNotContain("\n", ex.Message);
        Assert.False(family.TryCreate(values, out _, out var error));
        Assert.Equal(ex.Message, error);
    }

    [Fact]
    public void BounceRedshiftInTheMessageIsWhereESquaredVanishes()
    {
        // Ωm = 0, ΩΛ = 1.2: E² = 1.2 − 0.2(1+z)² = 0 at 1+z = √6, z = 1.449 (closed form).
        var ex = Assert.Throws<ArgumentException>(() => new LambdaCdmModel(70, 0.0, 1.2));
        Assert.Contains("z ≈ 1.449", ex.Message);
    }

    [Fact]
    public void FutureRecollapseIsAllowedBecauseThePastIsFine()
    {
        // Ωm = 0.3, ΩΛ = −0.5 (Ωk = 1.2): E² > 0 for all z ≥ 0; the recollapse lies at z < 0.
        var m = new LambdaCdmModel(70, 0.3, -0.5);
        Assert.True(double.IsFinite(m.AngularDiameterDistance(3)));
        // De Sitter (Ωm = 0, ΩΛ = 1): E = 1, D_C = D_H z exactly (closed form), no big bang at finite time → age +∞.
        var ds = new LambdaCdmModel(70, 0.0, 1.0);
        Assert.Equal(ds.HubbleDistance * 2.5, ds.ComovingDistance(2.5), 1e-9 * ds.HubbleDistance);
        Assert.Equal(double.PositiveInfinity, ds.AgeGyr);
    }

    [Fact]
    public void LoiteringButValidModelStillMatchesQuadrature()
    {
        // Ωm = 0.3, ΩΛ = 1.7: E² dips to ≈ 0.03 near z ≈ 2.3 without reaching 0 (near-loitering), a hard case for tables.
        var m = new LambdaCdmModel(70, 0.3, 1.7);
        foreach (double z in new[] { 0.5, 2.0, 2.3, 2.6, 5.0 })
            Assert.True(TestMath.Relative(m.AngularDiameterDistance(z), m.AngularDiameterDistanceByQuadrature(z)) < 1e-9, $"z = {z}");
    }

    [Fact]
    public void ExactAndSampledChecksAgreeOnRandomLambdaCdmSets()
    {
        var rng = new Random(99);
        int refused = 0;
        for (int k = 0; k < 2000; k++)
        {
            double r = rng.NextDouble() < 0.5 ? 0 : 1e-4 * rng.NextDouble();
            double m = 2 * rng.NextDouble(), l = -1 + 4 * rng.NextDouble();
            double kk = 1 - r - m - l;
            double? exact = ExpansionHistoryCheck.PolynomialZero(r, m, kk, l);
            double? sampled = ExpansionHistoryCheck.SampledZero(x => { double y = Math.Exp(x); return ((r * y + m) * y + kk) * y * y + l; });
            Assert.Equal(exact is null, sampled is null);
            if (exact is { } ze && sampled is { } zs)
            {
                refused++;
                Assert.True(Math.Abs(ze - zs) <= 1e-6 * (1 + ze), $"Ωr={r} Ωm={m} ΩΛ={l}: {ze} vs {zs}");
            }
        }
        Assert.True(refused > 100);
    }
}

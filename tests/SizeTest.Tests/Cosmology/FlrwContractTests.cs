using SizeTest.Cosmology;
using Xunit;

namespace SizeTest.Tests.Cosmology;

/// <summary>Extra contract of every FLRW model, on top of <see cref="WorldModelContractTests"/>.</summary>
public abstract class FlrwContractTests : WorldModelContractTests
{
    protected FlrwModel Flrw => (FlrwModel)Model;

    [Fact]
    public void AllDistancesAndTimesVanishAtZeroRedshift()
    {
        var m = Flrw;
        Assert.Equal(0.0, m.AngularDiameterDistance(0));
        Assert.Equal(0.0, m.ComovingDistance(0));
        Assert.Equal(0.0, m.LuminosityDistance(0));
        Assert.Equal(0.0, m.LookbackTime(0));
        var r = new double[1];
        m.AngularDiameterDistances([0.0], r);
        Assert.Equal(0.0, r[0]);
        Assert.Equal(double.PositiveInfinity, m.AngularSizeArcsec(0, 1)); // θ = ℓ/0, documented
    }

    [Theory]
    [InlineData(0.01)]
    [InlineData(0.5)]
    [InlineData(1.0)]
    [InlineData(2.5)]
    [InlineData(10.0)]
    public void EtheringtonRelationHolds(double z)
    {
        var m = Flrw;
        // D_L = (1+z)² D_A (Etherington 1933; Hogg 1999 eq. 21).
        Assert.Equal(m.LuminosityDistance(z), (1 + z) * (1 + z) * m.AngularDiameterDistance(z), 1e-12 * m.LuminosityDistance(z));
    }

    [Fact]
    public void TolmanDimmingIsTenLog10OnePlusZ()
    {
        var m = Flrw;
        Assert.Equal(4.0, m.BolometricDimmingExponent);
        // 10 log10(1+z) mag for n = 4; at z = 1: 3.0103 (docs/science.md §2.7, exact).
        Assert.Equal(10 * Math.Log10(2), m.TolmanDimmingMagnitudes(1), 1e-12);
        Assert.Equal(3.0103, m.TolmanDimmingMagnitudes(1), 4);
    }

    [Fact]
    public void FastDistancesMatchAdaptiveQuadratureToOneInABillion()
    {
        var m = Flrw;
        var rng = new Random(7);
        var z = Enumerable.Range(0, 400).Select(i => i < 200 ? 0.01 + 5.99 * rng.NextDouble() : Math.Pow(10, -4 + 8.5 * rng.NextDouble())).ToArray();
        var da = new double[z.Length];
        var dc = new double[z.Length];
        var tl = new double[z.Length];
        m.AngularDiameterDistances(z, da);
        m.ComovingDistances(z, dc);
        m.LookbackTimes(z, tl);
        double worst = 0;
        for (int i = 0; i < z.Length; i++)
        {
            // Reference: adaptive Gauss–Kronrod to 1e-14 (FlrwModel.*ByQuadrature); issue target 1e-9.
            worst = Math.Max(worst, Math.Abs(da[i] / m.AngularDiameterDistanceByQuadrature(z[i]) - 1));
            worst = Math.Max(worst, Math.Abs(dc[i] / m.ComovingDistanceByQuadrature(z[i]) - 1));
            worst = Math.Max(worst, Math.Abs(tl[i] / m.LookbackTimeByQuadrature(z[i]) - 1));
        }
        Assert.True(worst <= 1e-9, $"worst relative error {worst:E2}");
    }

    [Fact]
    public void VectorAndScalarHotLoopsAgree()
    {
        var m = Flrw;
        var rng = new Random(11);
        var z = Enumerable.Range(0, 5003).Select(_ => Math.Pow(10, -4 + 5 * rng.NextDouble())).ToArray();
        var fast = new double[z.Length];
        var plain = new double[z.Length];
        m.AngularDiameterDistances(z, fast);
        FlrwModel.DisableVectorPath = true; // this thread only (the switch is [ThreadStatic]): other tests compare bit for bit
        try { m.AngularDiameterDistances(z, plain); }
        finally { FlrwModel.DisableVectorPath = false; }
        for (int i = 0; i < z.Length; i++) Assert.Equal(plain[i], fast[i], 1e-13 * plain[i]);
    }

    [Fact]
    public void LuminosityAndTransverseVectorsAgreeWithScalars()
    {
        var m = Flrw;
        double[] z = [0.001, 0.3, 1.7, 4.2, 9.0];
        var dl = new double[z.Length];
        var dm = new double[z.Length];
        m.LuminosityDistances(z, dl);
        m.TransverseComovingDistances(z, dm);
        for (int i = 0; i < z.Length; i++)
        {
            Assert.Equal(m.LuminosityDistance(z[i]), dl[i], 1e-12 * dl[i]);
            Assert.Equal(m.TransverseComovingDistance(z[i]), dm[i], 1e-12 * dm[i]);
        }
    }

    [Fact]
    public void AgeExceedsEveryLookbackTime()
    {
        var m = Flrw;
        double age = m.AgeGyr;
        Assert.True(age > m.LookbackTime(1e5));
        // The lookback time to z = 1e5 is within 1e-3 of the age: the remainder (z > 1e5) is ≲ t_H/(1+z) (closed form for the slowest case, Milne).
        Assert.True(age - m.LookbackTime(1e5) < 1e-3 * age);
    }
}

using SizeTest.Cosmology;
using Xunit;

namespace SizeTest.Tests.Cosmology;

/// <summary>Einstein–de Sitter, H0 = 70.</summary>
public sealed class EinsteinDeSitterTests : FlrwContractTests
{
    protected override IWorldModel Model { get; } = WorldModels.EinsteinDeSitter.Create(new Dictionary<string, double>());

    [Fact]
    public void ClosedFormsMatchTheIntegralToTenDigits()
    {
        var m = (FlrwModel)Model;
        foreach (double z in new[] { 0.001, 0.1, 1.0, 3.0, 10.0, 1000.0 })
        {
            Assert.True(TestMath.Relative(m.ComovingDistance(z), m.ComovingDistanceByQuadrature(z)) < 1e-10);
            Assert.True(TestMath.Relative(m.LookbackTime(z), m.LookbackTimeByQuadrature(z)) < 1e-10);
        }
    }

    [Fact]
    public void AngularDiameterDistancePeaksAtFiveQuartersWithEightTwentySeventhsDH()
    {
        var m = (FlrwModel)Model;
        var (z, da) = TestMath.Maximum(m.AngularDiameterDistance, 0.5, 3);
        // D_A = 2D_H[1 − (1+z)^−½]/(1+z): dD_A/dz = 0 at z = 5/4, D_A,max = (8/27) D_H (science-checks §1.4, closed form).
        Assert.Equal(1.25, z, 6);
        Assert.Equal(8.0 / 27.0 * m.HubbleDistance, da, 1e-9 * da);
        // D_C(3) = D_H, D_L(3) = 4 D_H (closed form), age (2/3) t_H = 9.31231 Gyr (science-checks §2.4).
        Assert.Equal(m.HubbleDistance, m.ComovingDistance(3), 1e-12 * m.HubbleDistance);
        Assert.Equal(17130.9976, m.LuminosityDistance(3), 4);
        Assert.True(TestMath.Relative(m.AgeGyr, 9.31231) < 1e-6);
    }
}

/// <summary>Milne, H0 = 70.</summary>
public sealed class MilneTests : FlrwContractTests
{
    protected override IWorldModel Model { get; } = WorldModels.Milne.Create(new Dictionary<string, double>());

    [Fact]
    public void ClosedFormsMatchTheIntegralToTenDigits()
    {
        var m = (FlrwModel)Model;
        foreach (double z in new[] { 0.001, 0.1, 1.0, 3.0, 10.0, 1000.0 })
        {
            Assert.True(TestMath.Relative(m.ComovingDistance(z), m.ComovingDistanceByQuadrature(z)) < 1e-10);
            Assert.True(TestMath.Relative(m.LookbackTime(z), m.LookbackTimeByQuadrature(z)) < 1e-10);
        }
    }

    [Theory]
    [InlineData(0.1)]
    [InlineData(1.0)]
    [InlineData(2.0)]
    [InlineData(7.0)]
    public void LuminosityDistanceIsDHzTimesOnePlusHalfZ(double z)
    {
        var m = (FlrwModel)Model;
        // D_L = D_H z(1 + z/2) (science-checks §1.4, closed form of D_H (1+z) sinh ln(1+z)).
        Assert.Equal(m.HubbleDistance * z * (1 + z / 2), m.LuminosityDistance(z), 1e-12 * m.LuminosityDistance(z));
    }

    [Fact]
    public void AngularDiameterDistanceRisesMonotonicallyToHalfDH()
    {
        var m = (FlrwModel)Model;
        double prev = 0;
        for (double z = 0.1; z < 1000; z *= 1.3)
        {
            double da = m.AngularDiameterDistance(z);
            Assert.True(da > prev);
            prev = da;
        }
        // D_A = (D_H/2)[1 − (1+z)^−2] → D_H/2 (science-checks §1.4); D_L(2) = 4 D_H = 17130.9976 Mpc; age t_H = 13.96846 Gyr (§2.4).
        Assert.Equal(m.HubbleDistance / 2 * (1 - 1 / (1001.0 * 1001.0)), m.AngularDiameterDistance(1000), 1e-9);
        Assert.Equal(17130.9976, m.LuminosityDistance(2), 4);
        Assert.True(TestMath.Relative(m.AgeGyr, 13.96846) < 1e-6);
    }
}

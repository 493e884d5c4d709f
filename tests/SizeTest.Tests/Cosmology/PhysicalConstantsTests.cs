using SizeTest.Cosmology;
using Xunit;

namespace SizeTest.Tests.Cosmology;

public sealed class PhysicalConstantsTests
{
    [Fact]
    public void DerivedUnitsMatchTheirDefinitions()
    {
        // 1 Mpc = 3.0856775814913673e19 km (IAU 2015 B2 parsec from the IAU 2012 au).
        Assert.Equal(3.0856775814913673e19, PhysicalConstants.MegaparsecKm, 1e4);
        // 1/H0 = 977.792/H0 Gyr (docs/science.md Â§0; derivation in PhysicalConstants).
        Assert.Equal(977.792, PhysicalConstants.HubbleTimeGyrTimesH0, 3);
        // D_H = c/H0 = 4282.7494 Mpc for H0 = 70 (docs/science.md Â§0).
        Assert.Equal(4282.7494, PhysicalConstants.SpeedOfLightKmPerS / 70, 4);
    }

    [Fact]
    public void PhotonDensityTimesHSquaredIs2p47eMinus5()
    {
        // Ωγ h² = 2.47e-5 for T = 2.7255 K (docs/science.md §1.1, common practice); independent of H0.
        double h = 0.7;
        Assert.Equal(2.47e-5, PhysicalConstants.PhotonDensity(2.7255, 70) * h * h, 7);
        Assert.True(TestMath.Relative(PhysicalConstants.PhotonDensity(2.7255, 50) * 0.25, PhysicalConstants.PhotonDensity(2.7255, 100)) < 1e-14);
        // (7/8)(4/11)^{4/3} = 0.2271 (massless-neutrino convention, Kolb & Turner 1990).
        Assert.Equal(0.2271, PhysicalConstants.NeutrinoPhotonDensityRatio, 4);
    }
}

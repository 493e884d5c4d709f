using SizeTest.Cosmology;
using Xunit;

namespace SizeTest.Tests.Cosmology;

/// <summary>Flat ΛCDM, H0 = 70, Ωm = 0.3, no radiation.</summary>
public sealed class FlatLambdaCdmTests : FlrwContractTests
{
    protected override IWorldModel Model { get; } = WorldModels.LambdaCdm.Create(new Dictionary<string, double> { ["omega_m"] = 0.3 });

    [Theory]
    // Reference: astropy 5.2.1, FlatLambdaCDM(70, 0.3, Tcmb0=0) (docs/science.md §2.2) — z, D_C, D_A, D_L, t_L.
    [InlineData(0.1, 418.4545, 380.4132, 460.2999, 1.30130)]
    [InlineData(0.5, 1888.6254, 1259.0836, 2832.9381, 5.04064)]
    [InlineData(1.0, 3303.8288, 1651.9144, 6607.6576, 7.71534)]
    [InlineData(2.0, 5179.8621, 1726.6207, 15539.5862, 10.24036)]
    [InlineData(3.0, 6355.6854, 1588.9214, 25422.7417, 11.35446)]
    [InlineData(5.0, 7775.3705, 1295.8951, 46652.2230, 12.31223)]
    public void MatchesTabulatedDistances(double z, double dc, double da, double dl, double tl)
    {
        var m = Model;
        Assert.True(TestMath.Relative(m.ComovingDistance(z), dc) < 2e-7); // table rounded to 8 digits
        Assert.True(TestMath.Relative(m.AngularDiameterDistance(z), da) < 2e-7);
        Assert.True(TestMath.Relative(m.LuminosityDistance(z), dl) < 2e-7);
        Assert.True(TestMath.Relative(m.LookbackTime(z), tl) < 5e-6);
    }

    [Fact]
    public void AngularSizeMinimumIsAtZ1p6054()
    {
        var m = Model;
        var (z, da) = TestMath.Maximum(m.AngularDiameterDistance, 0.5, 4);
        // Reference: astropy 5.2.1 (docs/science.md §2.2/§2.5): z_max = 1.6054, D_A,max = 1747.572 Mpc; θ_min(10 kpc) = 1.18029″ (§2.6).
        Assert.InRange(z, 1.6054 - 1e-4, 1.6054 + 1e-4); // tolerance 1e-4 in z_max (docs/science.md §2)
        Assert.True(TestMath.Relative(da, 1747.572) < 1e-6);
        Assert.True(TestMath.Relative(m.AngularSizeArcsec(z, 10), 1.18029) < 5e-6);
    }

    [Fact]
    public void HubbleFunctionAndAgeMatchReference()
    {
        var m = (FlrwModel)Model;
        // E(1) = sqrt(0.3·8 + 0.7) = sqrt(3.1) = 1.7606817 (closed form; docs/science.md §2.4).
        Assert.Equal(Math.Sqrt(3.1), m.HubbleFunction(1), 14);
        // Age 13.46698 Gyr (astropy 5.2.1, docs/science.md §2.2).
        Assert.True(TestMath.Relative(m.AgeGyr, 13.46698) < 1e-6);
    }

    [Theory]
    // θ of 10 kpc in arcsec (astropy 5.2.1, docs/science.md §2.6).
    [InlineData(0.1, 5.42213)]
    [InlineData(1.0, 1.24864)]
    [InlineData(5.0, 1.59168)]
    public void AngularSizesMatchTable(double z, double theta) => Assert.True(TestMath.Relative(Model.AngularSizeArcsec(z, 10), theta) < 2e-6);

    [Fact]
    public void OmegaLambdaNotGivenMeansFlat()
    {
        var m = (FlrwModel)Model;
        Assert.Equal(0.0, m.OmegaCurvature);
        Assert.Equal(0.7, m.OmegaDarkEnergy, 15);
        // NaN for a derived-default parameter is the same as leaving it out.
        var viaNaN = (FlrwModel)WorldModels.LambdaCdm.Create(new Dictionary<string, double> { ["omega_lambda"] = double.NaN });
        Assert.Equal(0.0, viaNaN.OmegaCurvature);
    }
}

/// <summary>Flat ΛCDM with radiation: T_CMB = 2.725 K, N_eff = 3.04, massless neutrinos.</summary>
public sealed class RadiationLambdaCdmTests : FlrwContractTests
{
    protected override IWorldModel Model { get; } = WorldModels.LambdaCdm.Create(new Dictionary<string, double> { ["t_cmb"] = 2.725, ["n_eff"] = 3.04 });

    [Fact]
    public void RadiationDensityFollowsTheStatedConvention()
    {
        var m = (FlrwModel)Model;
        // astropy 5.2.1 FlatLambdaCDM(70, 0.3, Tcmb0=2.725): Ogamma0 = 5.0432e-5, Onu0 = 3.4818e-5 (docs/science.md §2.3).
        double photons = PhysicalConstants.PhotonDensity(2.725, 70);
        Assert.True(TestMath.Relative(photons, 5.0432e-5) < 1e-4);
        Assert.True(TestMath.Relative(m.OmegaRadiation - photons, 3.4818e-5) < 1e-4);
        Assert.Equal(1.0 - 0.3 - m.OmegaRadiation, m.OmegaDarkEnergy, 15); // flat: ΩΛ = 1 − Ωm − Ωr
    }

    [Fact]
    public void ComovingDistanceAndAgeMatchReference()
    {
        var m = (FlrwModel)Model;
        // astropy 5.2.1 with radiation (docs/science.md §2.3): D_C(1) = 3303.5264, D_L(1) = 6607.0529, age 13.4617 Gyr.
        Assert.True(TestMath.Relative(m.ComovingDistance(1), 3303.5264) < 2e-8);
        Assert.True(TestMath.Relative(m.LuminosityDistance(1), 6607.0529) < 2e-8);
        Assert.True(TestMath.Relative(m.AgeGyr, 13.4617) < 1e-5);
    }
}

/// <summary>Closed ΛCDM: Ωm = 0.3, ΩΛ = 0.8 (Ωk = −0.1).</summary>
public sealed class ClosedLambdaCdmTests : FlrwContractTests
{
    protected override IWorldModel Model { get; } = WorldModels.LambdaCdm.Create(new Dictionary<string, double> { ["omega_m"] = 0.3, ["omega_lambda"] = 0.8 });

    [Fact]
    public void MatchesReferenceRow()
    {
        var m = (FlrwModel)Model;
        Assert.Equal(-0.1, m.OmegaCurvature, 14);
        // astropy 5.2.1 (docs/science.md §2.4): D_C(1) 3408.9370, D_M(1) 3373.0544, D_A(3) 1587.8885, age 13.92250, z_max 1.5556, D_A,max 1777.2054.
        Assert.True(TestMath.Relative(m.ComovingDistance(1), 3408.9370) < 2e-8);
        Assert.True(TestMath.Relative(m.TransverseComovingDistance(1), 3373.0544) < 2e-8);
        Assert.True(TestMath.Relative(m.AngularDiameterDistance(3), 1587.8885) < 2e-8);
        Assert.True(TestMath.Relative(m.AgeGyr, 13.92250) < 1e-6);
        var (z, da) = TestMath.Maximum(m.AngularDiameterDistance, 0.5, 4);
        Assert.InRange(z, 1.5556 - 1e-4, 1.5556 + 1e-4); // tolerance 1e-4 in z_max (docs/science.md §2)
        Assert.True(TestMath.Relative(da, 1777.2054) < 1e-7);
    }
}

/// <summary>Open ΛCDM: Ωm = 0.3, ΩΛ = 0.5 (Ωk = +0.2).</summary>
public sealed class OpenLambdaCdmTests : FlrwContractTests
{
    protected override IWorldModel Model { get; } = WorldModels.LambdaCdm.Create(new Dictionary<string, double> { ["omega_m"] = 0.3, ["omega_lambda"] = 0.5 });

    [Fact]
    public void MatchesReferenceRow()
    {
        var m = (FlrwModel)Model;
        // astropy 5.2.1 (docs/science.md §2.4): D_C(1) 3124.8660, D_M(1) 3180.6153, D_L(1) 6361.2306, age 12.69749, z_max 1.6982.
        Assert.True(TestMath.Relative(m.ComovingDistance(1), 3124.8660) < 2e-8);
        Assert.True(TestMath.Relative(m.TransverseComovingDistance(1), 3180.6153) < 2e-8);
        Assert.True(TestMath.Relative(m.LuminosityDistance(1), 6361.2306) < 2e-8);
        Assert.True(TestMath.Relative(m.AgeGyr, 12.69749) < 1e-6);
        Assert.InRange(TestMath.Maximum(m.AngularDiameterDistance, 0.5, 4).X, 1.6982 - 1e-4, 1.6982 + 1e-4); // tolerance 1e-4 in z_max (docs/science.md §2)
        // E(1) for Ωm = 0.3, Ωk = 0.1, ΩΛ = 0.6 is 1.8439089 (docs/science.md §2.4): a different model, built here.
        var other = new LambdaCdmModel(70, 0.3, 0.6);
        Assert.Equal(1.8439089, other.HubbleFunction(1), 7);
    }
}

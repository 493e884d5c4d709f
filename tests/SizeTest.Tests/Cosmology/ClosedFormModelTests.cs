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
        // D_A = 2D_H[1 − (1+z)^−½]/(1+z): dD_A/dz = 0 at z = 5/4, D_A,max = (8/27) D_H (docs/science.md §1.4, closed form).
        Assert.Equal(1.25, z, 6);
        Assert.Equal(8.0 / 27.0 * m.HubbleDistance, da, 1e-9 * da);
        // D_C(3) = D_H, D_L(3) = 4 D_H (closed form), age (2/3) t_H = 9.31231 Gyr (docs/science.md §2.4).
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
        // D_L = D_H z(1 + z/2) (docs/science.md §1.4, closed form of D_H (1+z) sinh ln(1+z)).
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
        // D_A = (D_H/2)[1 − (1+z)^−2] → D_H/2 (docs/science.md §1.4); D_L(2) = 4 D_H = 17130.9976 Mpc; age t_H = 13.96846 Gyr (§2.4).
        Assert.Equal(m.HubbleDistance / 2 * (1 - 1 / (1001.0 * 1001.0)), m.AngularDiameterDistance(1000), 1e-9);
        Assert.Equal(17130.9976, m.LuminosityDistance(2), 4);
        Assert.True(TestMath.Relative(m.AgeGyr, 13.96846) < 1e-6);
    }
}

/// <summary>Independent closed forms checked against the general ΛCDM integral.</summary>
public sealed class ClosedFormCrossChecks
{
    [Theory]
    [InlineData(0.3)]
    [InlineData(1.0)]
    [InlineData(2.0)]
    public void MatterOnlyModelsFollowMattig(double omegaM)
    {
        // Λ = 0: D_L = (D_H/q0²)[q0 z + (q0 − 1)(√(1 + 2q0 z) − 1)], q0 = Ωm/2 (Mattig 1958; docs/science.md §1.4).
        var m = new LambdaCdmModel(70, omegaM, 0.0);
        double q0 = omegaM / 2;
        foreach (double z in new[] { 0.1, 1.0, 3.0, 9.0 })
        {
            double mattig = m.HubbleDistance / (q0 * q0) * (q0 * z + (q0 - 1) * (Math.Sqrt(1 + 2 * q0 * z) - 1));
            Assert.True(TestMath.Relative(m.LuminosityDistance(z), mattig) < 1e-11, $"Ωm = {omegaM}, z = {z}");
        }
    }

    [Fact]
    public void EinsteinDeSitterAndMilneAreTheLimitsOfGeneralLambdaCdm()
    {
        // Ωm = 1, ΩΛ = 0 is EdS; Ωm = ΩΛ = 0 is Milne (definitions): the table path must reproduce the closed forms.
        var eds = new EinsteinDeSitterModel();
        var milne = new MilneModel();
        var lEds = new LambdaCdmModel(70, 1.0, 0.0);
        var lMilne = new LambdaCdmModel(70, 0.0, 0.0);
        foreach (double z in new[] { 0.01, 0.5, 1.25, 4.0, 100.0 })
        {
            Assert.True(TestMath.Relative(lEds.AngularDiameterDistance(z), eds.AngularDiameterDistance(z)) < 1e-10);
            Assert.True(TestMath.Relative(lMilne.AngularDiameterDistance(z), milne.AngularDiameterDistance(z)) < 1e-10);
            Assert.True(TestMath.Relative(lMilne.LookbackTime(z), milne.LookbackTime(z)) < 1e-10);
        }
    }

    [Theory]
    // θ of 10 kpc in arcsec, EdS and Milne (astropy 5.2.1, docs/science.md §2.6).
    [InlineData(0.5, 1.96843, 1.73382)]
    [InlineData(2.0, 1.70928, 1.08364)]
    [InlineData(5.0, 2.44165, 0.99076)]
    public void AngularSizesMatchTable(double z, double edsTheta, double milneTheta)
    {
        Assert.True(TestMath.Relative(new EinsteinDeSitterModel().AngularSizeArcsec(z, 10), edsTheta) < 5e-6);
        Assert.True(TestMath.Relative(new MilneModel().AngularSizeArcsec(z, 10), milneTheta) < 5e-6);
        // EdS θ_min = 1.62546″ at z = 1.25 (docs/science.md §2.6).
        Assert.True(TestMath.Relative(new EinsteinDeSitterModel().AngularSizeArcsec(1.25, 10), 1.62546) < 5e-6);
    }

    /// <summary>
    /// Empty spans are a valid request that writes nothing and leaves the model usable; spans of
    /// different lengths are refused.
    /// </summary>
    [Fact]
    public void EmptyInputWritesNothingAndMismatchedSpansAreRefused()
    {
        var m = new LambdaCdmModel();
        var buffer = new[] { -1.0 };
        m.AngularDiameterDistances([], buffer.AsSpan(0, 0));
        m.LookbackTimes([], buffer.AsSpan(0, 0));
        Assert.Equal(-1.0, buffer[0]);
        // After the empty calls the model still answers: flat ΛCDM 0.3, D_A(1) = 1651.9144 Mpc
        // (astropy 5.2.1, docs/science.md §2.2), to 1e-6 relative.
        var one = new double[1];
        m.AngularDiameterDistances([1.0], one);
        Assert.True(TestMath.Relative(one[0], 1651.9144) < 1e-6, $"D_A(1) = {one[0]}");
        Assert.Throws<ArgumentException>(() => m.AngularDiameterDistances([1.0, 2.0], new double[1]));
    }
}

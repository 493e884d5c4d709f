using SizeTest.Cosmology;
using Xunit;

namespace SizeTest.Tests.Cosmology;

/// <summary>Contract additions for static models.</summary>
public abstract class StaticContractTests : WorldModelContractTests
{
    protected StaticEuclideanModel Static => (StaticEuclideanModel)Model;

    [Fact]
    public void ZeroRedshiftIsRefused()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => Static.AngularDiameterDistance(0));
        Assert.Throws<ArgumentOutOfRangeException>(() => Static.AngularDiameterDistances([0.0], new double[1]));
    }

    [Fact]
    public void DefaultsAreEnergyLossOnlyWithDimmingExponentOne()
    {
        var m = Static;
        Assert.False(m.IsExpanding);
        Assert.Equal(1.0, m.BolometricDimmingExponent);
        Assert.False(m.Defines(DistanceQuantity.TransverseComoving));
        Assert.True(double.IsNaN(m.TransverseComovingDistance(1)));
        // Energy loss only: D_L = d √(1+z) (docs/science.md §1.5); θ uses D_A := d.
        Assert.Equal(m.Distance(2) * Math.Sqrt(3), m.LuminosityDistance(2), 1e-9);
        Assert.Equal(m.Distance(2), m.AngularDiameterDistance(2));
        // Light-travel time d/c: d/D_H · t_H (definition, documented).
        Assert.Equal(m.Distance(2) / m.HubbleDistance * 977.7922216807891 / 70, m.LookbackTime(2), 1e-9);
    }

    [Fact]
    public void TimeDilatedFluxConventionGivesDLEqualsDTimesOnePlusZAndDimmingTwo()
    {
        var m = (StaticEuclideanModel)Family.Create(new Dictionary<string, double> { ["luminosity_exponent"] = 1.0 });
        // Energy loss + arrival-rate dilation: D_L = d(1+z) (docs/science.md §1.5, common practice); n = 2q = 2.
        Assert.Equal(m.Distance(3) * 4, m.LuminosityDistance(3), 1e-9);
        Assert.Equal(2.0, m.BolometricDimmingExponent);
        var free = Family.Create(new Dictionary<string, double> { ["dimming_exponent"] = 3.0 });
        Assert.Equal(3.0, free.BolometricDimmingExponent);
        // Dimming 2.5·1·log10(1+z): 1.5051 mag at z = 3 for n = 1 (docs/science.md §2.7).
        Assert.Equal(1.5051, Model.TolmanDimmingMagnitudes(3), 4);
    }
}

/// <summary>Static Euclidean, d = cz/H0.</summary>
public sealed class StaticLinearTests : StaticContractTests
{
    protected override IWorldModel Model { get; } = WorldModels.StaticLinear.Create(new Dictionary<string, double>());

    [Fact]
    public void MatchesReferenceValues()
    {
        var m = Static;
        // docs/science.md §2.4: d(1) = D_H = 4282.7494, D_L(1) = d√2 = 6056.7223 (c = 299792.458 km/s exact, H0 = 70).
        Assert.Equal(4282.7494, m.ComovingDistance(1), 4);
        Assert.Equal(6056.7223, m.LuminosityDistance(1), 4);
    }

    [Theory]
    // θ of 10 kpc (docs/science.md §2.6): θ = ℓ H0/(cz), ∝ 1/z.
    [InlineData(0.1, 4.81618)]
    [InlineData(1.0, 0.48162)]
    [InlineData(5.0, 0.09632)]
    public void AngularSizesMatchTable(double z, double theta) => Assert.Equal(theta, Model.AngularSizeArcsec(z, 10), 5);
}

/// <summary>Static Euclidean tired light, d = (c/H0) ln(1+z).</summary>
public sealed class TiredLightTests : StaticContractTests
{
    protected override IWorldModel Model { get; } = WorldModels.TiredLight.Create(new Dictionary<string, double>());

    [Fact]
    public void MatchesReferenceValues()
    {
        var m = Static;
        // docs/science.md §2.4: d(1) = D_H ln 2 = 2968.5757 (= Milne D_C), D_L(1) = d√2 = 4198.2000.
        Assert.Equal(2968.5757, m.ComovingDistance(1), 4);
        Assert.Equal(4198.2000, m.LuminosityDistance(1), 4);
        Assert.Equal(new MilneModel().ComovingDistance(1.7), m.Distance(1.7), 1e-9);
    }

    [Theory]
    // θ of 10 kpc (docs/science.md §2.6).
    [InlineData(0.1, 5.05316)]
    [InlineData(2.0, 0.43839)]
    [InlineData(5.0, 0.26880)]
    public void AngularSizesMatchTable(double z, double theta) => Assert.Equal(theta, Model.AngularSizeArcsec(z, 10), 5);
}

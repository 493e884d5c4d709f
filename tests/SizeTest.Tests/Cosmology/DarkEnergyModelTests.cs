using SizeTest.Cosmology;
using Xunit;

namespace SizeTest.Tests.Cosmology;

/// <summary>Flat wCDM, w = −0.9, Ωm = 0.3.</summary>
public sealed class WCdmTests : FlrwContractTests
{
    protected override IWorldModel Model { get; } = WorldModels.WCdm.Create(new Dictionary<string, double> { ["w0"] = -0.9 });

    [Fact]
    public void MatchesReferenceRow()
    {
        var m = (FlrwModel)Model;
        // astropy 5.2.1 (docs/science.md §2.4): D_C(1) 3236.6978, D_A(3) 1559.0250, age 13.24719, z_max 1.6095, D_A,max 1711.1580.
        Assert.True(TestMath.Relative(m.ComovingDistance(1), 3236.6978) < 2e-8);
        Assert.True(TestMath.Relative(m.AngularDiameterDistance(3), 1559.0250) < 2e-8);
        Assert.True(TestMath.Relative(m.AgeGyr, 13.24719) < 1e-6);
        var (z, da) = TestMath.Maximum(m.AngularDiameterDistance, 0.5, 4);
        Assert.InRange(z, 1.6095 - 1e-4, 1.6095 + 1e-4); // tolerance 1e-4 in z_max (docs/science.md §2)
        Assert.True(TestMath.Relative(da, 1711.1580) < 1e-7);
    }

    [Fact]
    public void WEqualsMinusOneIsLambdaCdm()
    {
        // Closed form: (1+z)^{3(1+w)} = 1 for w = −1, so wCDM reduces to ΛCDM exactly.
        var w = new WCdmModel(70, 0.3, -1.0, 0.6);
        var l = new LambdaCdmModel(70, 0.3, 0.6);
        foreach (double z in new[] { 0.2, 1.0, 4.0 })
            Assert.Equal(l.AngularDiameterDistance(z), w.AngularDiameterDistance(z), 1e-12 * l.AngularDiameterDistance(z));
    }
}

/// <summary>Flat CPL, w0 = −0.9, wa = 0.2, Ωm = 0.3.</summary>
public sealed class W0WaCdmTests : FlrwContractTests
{
    protected override IWorldModel Model { get; } = WorldModels.W0WaCdm.Create(new Dictionary<string, double> { ["w0"] = -0.9, ["wa"] = 0.2 });

    [Fact]
    public void MatchesReferenceRow()
    {
        var m = (FlrwModel)Model;
        // docs/science.md §2.4 (astropy 5.2.1 / closed form): E(2) = 3.0596104; D_C(1) 3211.3443; age 13.12679; z_max 1.5965.
        Assert.Equal(3.0596104, m.HubbleFunction(2), 7);
        Assert.True(TestMath.Relative(m.ComovingDistance(1), 3211.3443) < 2e-8);
        Assert.True(TestMath.Relative(m.AgeGyr, 13.12679) < 1e-6);
        Assert.InRange(TestMath.Maximum(m.AngularDiameterDistance, 0.5, 4).X, 1.5965 - 1e-4, 1.5965 + 1e-4); // tolerance 1e-4 in z_max (docs/science.md §2)
    }

    [Fact]
    public void ZeroWaIsConstantW()
    {
        // Closed form: wa = 0 makes f(z) = (1+z)^{3(1+w0)}, the wCDM density.
        var cpl = new W0WaCdmModel(70, 0.3, -0.8, 0.0);
        var w = new WCdmModel(70, 0.3, -0.8);
        Assert.Equal(w.ComovingDistance(2), cpl.ComovingDistance(2), 1e-12 * w.ComovingDistance(2));
    }
}

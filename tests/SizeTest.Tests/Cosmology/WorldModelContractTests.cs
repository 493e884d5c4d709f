using SizeTest.Cosmology;
using Xunit;

namespace SizeTest.Tests.Cosmology;

/// <summary>
/// The contract every world model must meet; each model's test class inherits it and so
/// re-runs every check (style: astropy's inherited cosmology test classes).
/// </summary>
public abstract class WorldModelContractTests
{
    /// <summary>The model under test, built through its family.</summary>
    protected abstract IWorldModel Model { get; }

    /// <summary>Its family.</summary>
    protected IWorldModelFamily Family => WorldModels.Get(Model.Name);

    /// <summary>Documented valid range used for the finite-output sweep.</summary>
    protected static IEnumerable<double> Sweep()
    {
        for (double lz = -4; lz <= 5.0001; lz += 0.05) yield return Math.Pow(10, lz); // 1e-4 … 1e5
    }

    [Fact]
    public void OutputsAreFiniteOverTheDocumentedRange()
    {
        var m = Model;
        foreach (double z in Sweep())
        {
            Assert.True(double.IsFinite(m.ComovingDistance(z)) && m.ComovingDistance(z) > 0, $"D_C at z = {z}");
            Assert.True(double.IsFinite(m.AngularDiameterDistance(z)) && m.AngularDiameterDistance(z) > 0, $"D_A at z = {z}");
            Assert.True(double.IsFinite(m.LuminosityDistance(z)) && m.LuminosityDistance(z) > 0, $"D_L at z = {z}");
            Assert.True(double.IsFinite(m.LookbackTime(z)) && m.LookbackTime(z) > 0, $"t_L at z = {z}");
            Assert.True(double.IsFinite(m.AngularSizeArcsec(z, 1.0)), $"theta at z = {z}");
            Assert.True(double.IsFinite(m.TolmanDimmingMagnitudes(z)), $"dimming at z = {z}");
            Assert.Equal(m.Defines(DistanceQuantity.TransverseComoving), double.IsFinite(m.TransverseComovingDistance(z)));
        }
    }

    [Fact]
    public void ComovingDistanceAndLookbackTimeIncreaseMonotonically()
    {
        var m = Model;
        double prevD = 0, prevT = 0;
        foreach (double z in Sweep())
        {
            double d = m.ComovingDistance(z), t = m.LookbackTime(z);
            Assert.True(d > prevD, $"D_C not increasing at z = {z}");
            Assert.True(t > prevT, $"t_L not increasing at z = {z}");
            prevD = d;
            prevT = t;
        }
    }

    [Theory]
    [InlineData(double.NaN)]
    [InlineData(-0.5)]
    [InlineData(double.PositiveInfinity)]
    [InlineData(2e5)]
    public void InvalidRedshiftsThrow(double z)
    {
        var m = Model;
        Assert.Throws<ArgumentOutOfRangeException>(() => m.AngularDiameterDistance(z));
        Assert.Throws<ArgumentOutOfRangeException>(() => m.ComovingDistance(z));
        Assert.Throws<ArgumentOutOfRangeException>(() => m.LuminosityDistance(z));
        Assert.Throws<ArgumentOutOfRangeException>(() => m.LookbackTime(z));
        Assert.Throws<ArgumentOutOfRangeException>(() => m.AngularDiameterDistances([1.0, z], new double[2]));
    }

    [Fact]
    public void VectorisedDistancesEqualScalarOnesInAnyOrder()
    {
        var m = Model;
        var rng = new Random(20261201);
        var z = Enumerable.Range(0, 1001).Select(_ => 0.001 + 7.0 * rng.NextDouble()).ToArray();
        var r = new double[z.Length];
        m.AngularDiameterDistances(z, r);
        for (int i = 0; i < z.Length; i++)
            Assert.Equal(m.AngularDiameterDistance(z[i]), r[i], 1e-12 * r[i]); // same tables: equal to rounding
        Assert.Throws<ArgumentException>(() => m.AngularDiameterDistances(z, new double[3]));
    }

    [Theory]
    [InlineData(0.5)]
    [InlineData(1.0)]
    [InlineData(3.0)]
    public void ThetaIsSizeOverAngularDiameterDistance(double z)
    {
        var m = Model;
        // θ = ℓ/D_A (small angle), ℓ = 10 kpc = 0.01 Mpc, 206264.806… arcsec per radian (common practice).
        Assert.Equal(0.01 / m.AngularDiameterDistance(z) * (648000 / Math.PI), m.AngularSizeArcsec(z, 10.0), 1e-12);
    }

    [Theory]
    [InlineData(0.5)]
    [InlineData(2.0)]
    public void DimmingIsTolmanLawWithTheModelsExponent(double z)
    {
        var m = Model;
        // Δμ = 2.5 n log10(1+z) (Tolman 1930; docs/science.md §1.6).
        Assert.Equal(2.5 * m.BolometricDimmingExponent * Math.Log10(1 + z), m.TolmanDimmingMagnitudes(z), 1e-12);
    }

    [Fact]
    public void FamilyRefusesUnknownAndOutOfRangeParameters()
    {
        var f = Family;
        var unknown = Assert.Throws<ArgumentException>(() => f.Create(new Dictionary<string, double> { ["no_such_parameter"] = 1 }));
        Assert.Contains("no_such_parameter", unknown.Message);
        Assert.Throws<ArgumentException>(() => f.Create(new Dictionary<string, double> { ["h0"] = -70 }));
        Assert.Throws<ArgumentException>(() => f.Create(new Dictionary<string, double> { ["h0"] = double.NaN }));
        Assert.False(f.TryCreate(new Dictionary<string, double> { ["h0"] = 1e6 }, out var model, out var error));
        Assert.Null(model);
        Assert.Contains("h0", error);
    }

    [Fact]
    public void FamilyDefaultsReproduceTheModelAtDefaults()
    {
        var f = Family;
        var m = f.Create(new Dictionary<string, double>());
        Assert.Equal(f.Name, m.Name);
        Assert.Equal(f.IsExpanding, m.IsExpanding);
        Assert.Equal(70.0, m.HubbleConstant);
        foreach (var p in f.Parameters) Assert.True(m.ParameterValues.ContainsKey(p.Name), p.Name);
    }
}

using SizeTest.Cosmology;
using Xunit;

namespace SizeTest.Tests.Cosmology;

/// <summary>
/// The world-model factories read their parameters by spec (<see cref="WorldModelValues"/>),
/// not by position: each family built from named values equals the model class built directly
/// with the same values (bit for bit), a reordered parameter list builds the same model, and a
/// list with a parameter left out (or one the factory never reads) is refused when the family is
/// defined. The values are deliberately all different from each other and from the defaults, so
/// that handing one parameter's value to another changes the distances.
/// </summary>
public sealed class WorldModelFactoryTests
{
    private static readonly double[] Redshifts = [0.1, 1.0, 3.0];

    private static Dictionary<string, double> Values(IWorldModelFamily family)
    {
        var all = new Dictionary<string, double>
        {
            [WorldModelParameters.Names.H0] = 67.4,
            [WorldModelParameters.Names.OmegaMatter] = 0.315,
            [WorldModelParameters.Names.OmegaLambda] = 0.68,
            [WorldModelParameters.Names.W0] = -0.9,
            [WorldModelParameters.Names.Wa] = 0.2,
            [WorldModelParameters.Names.CmbTemperature] = 2.7255,
            [WorldModelParameters.Names.EffectiveNeutrinoSpecies] = 3.046,
            [WorldModelParameters.Names.LuminosityExponent] = 1.0,
            [WorldModelParameters.Names.DimmingExponent] = 3.0,
        };
        return family.Parameters.ToDictionary(p => p.Name, p => all[p.Name]);
    }

    /// <summary>Each family against its model class's constructor, called with the same values by argument name.</summary>
    public static TheoryData<string> Families() => new(WorldModels.Names);

    private static IWorldModel Direct(string family) => family switch
    {
        "lcdm" => new LambdaCdmModel(hubbleConstant: 67.4, omegaMatter: 0.315, omegaLambda: 0.68, cmbTemperatureK: 2.7255, effectiveNeutrinoSpecies: 3.046),
        "wcdm" => new WCdmModel(hubbleConstant: 67.4, omegaMatter: 0.315, w: -0.9, omegaDarkEnergy: 0.68, cmbTemperatureK: 2.7255, effectiveNeutrinoSpecies: 3.046),
        "w0wacdm" => new W0WaCdmModel(hubbleConstant: 67.4, omegaMatter: 0.315, w0: -0.9, wa: 0.2, omegaDarkEnergy: 0.68, cmbTemperatureK: 2.7255, effectiveNeutrinoSpecies: 3.046),
        "eds" => new EinsteinDeSitterModel(67.4),
        "milne" => new MilneModel(67.4),
        "static-linear" => new StaticEuclideanModel(StaticDistanceLaw.Linear, hubbleConstant: 67.4, luminosityExponent: 1.0, dimmingExponent: 3.0),
        "tired-light" => new StaticEuclideanModel(StaticDistanceLaw.Logarithmic, hubbleConstant: 67.4, luminosityExponent: 1.0, dimmingExponent: 3.0),
        _ => throw new ArgumentOutOfRangeException(nameof(family), family, "a family without a direct construction in this test"),
    };

    private static void AssertSameModel(IWorldModel expected, IWorldModel actual)
    {
        foreach (double z in Redshifts)
        {
            Assert.Equal(expected.ComovingDistance(z), actual.ComovingDistance(z));
            Assert.Equal(expected.LuminosityDistance(z), actual.LuminosityDistance(z));
            Assert.Equal(expected.AngularDiameterDistance(z), actual.AngularDiameterDistance(z));
            Assert.Equal(expected.LookbackTime(z), actual.LookbackTime(z));
            Assert.Equal(expected.TolmanDimmingMagnitudes(z), actual.TolmanDimmingMagnitudes(z));
        }
    }

    [Theory]
    [MemberData(nameof(Families))]
    public void TheFamilyBuildsTheModelClassWithTheNamedValues(string name)
    {
        var family = WorldModels.Get(name);
        AssertSameModel(Direct(name), family.Create(Values(family)));
    }

    [Theory]
    [MemberData(nameof(Families))]
    public void AReversedParameterListBuildsTheSameModel(string name)
    {
        var family = (WorldModelFamily)WorldModels.Get(name);
        var reversed = family.WithParameters(family.Parameters.Reverse().ToArray());
        Assert.Equal(family.Parameters.Select(p => p.Name).Reverse(), reversed.Parameters.Select(p => p.Name));
        AssertSameModel(family.Create(Values(family)), reversed.Create(Values(family)));
    }

    [Theory]
    [MemberData(nameof(Families))]
    public void AParameterLeftOutOfTheListIsRefusedWhenTheFamilyIsDefined(string name)
    {
        var family = (WorldModelFamily)WorldModels.Get(name);
        foreach (var omitted in family.Parameters)
        {
            var error = Assert.Throws<InvalidOperationException>(() => family.WithParameters(family.Parameters.Where(p => p != omitted).ToArray()));
            Assert.Contains($"'{omitted.Name}'", error.Message);
            Assert.Contains("does not declare", error.Message);
        }
    }

    [Fact]
    public void ADeclaredParameterTheFactoryNeverReadsIsRefused()
    {
        var error = Assert.Throws<InvalidOperationException>(() => new WorldModelFamily("eds-extra", "test", true, "(1+z)^-4",
            [WorldModelParameters.H0, WorldModelParameters.W0],
            (WorldModelValues v, out string? e) => { e = null; return new EinsteinDeSitterModel(v[WorldModelParameters.H0]); }));
        Assert.Contains("'w0'", error.Message);
        Assert.Contains("never reads", error.Message);
    }

    [Fact]
    public void AParameterDeclaredTwiceIsRefused()
    {
        var error = Assert.Throws<InvalidOperationException>(() => WorldModels.EinsteinDeSitter.WithParameters([WorldModelParameters.H0, WorldModelParameters.H0]));
        Assert.Contains("'h0' twice", error.Message);
    }
}

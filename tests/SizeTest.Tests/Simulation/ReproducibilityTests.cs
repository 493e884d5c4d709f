using Xunit;
using SizeTest.Cosmology;
using SizeTest.Simulation;

namespace SizeTest.Tests.Simulation;

/// <summary>A seed gives the same catalogue bit for bit, whatever the threading; another seed gives another.</summary>
public sealed class ReproducibilityTests
{
    private static MockSurveySpec Spec(long seed, int n = 40000) => new(
        WorldModels.Get("lcdm").Create(new Dictionary<string, double>()),
        new SurveyDesign(n, RedshiftDistribution.Survey(1.0), Errors: new MeasurementErrors(0.05, 0.01, 0.1, 0.02), Selection: new MockSelection(SbLimit: 24.5)),
        seed);

    private static long[] Bits(double[] a) => a.Select(BitConverter.DoubleToInt64Bits).ToArray();

    [Fact]
    public void SameSeedGivesTheSameCatalogueBitForBit()
    {
        var a = MockSurveyGenerator.Generate(Spec(7));
        var b = MockSurveyGenerator.Generate(Spec(7), parallel: false);
        Assert.Equal(a.Drawn, b.Drawn);
        Assert.Equal(Bits(a.Z), Bits(b.Z));
        Assert.Equal(Bits(a.ThetaArcsec), Bits(b.ThetaArcsec));
        Assert.Equal(Bits(a.ThetaErrArcsec), Bits(b.ThetaErrArcsec));
        Assert.Equal(Bits(a.Mu!), Bits(b.Mu!));
        Assert.Equal(Bits(a.ZErr!), Bits(b.ZErr!));
    }

    [Fact]
    public void AnotherSeedGivesAnotherCatalogue()
    {
        var a = MockSurveyGenerator.Generate(Spec(7, 1000));
        var b = MockSurveyGenerator.Generate(Spec(8, 1000));
        Assert.NotEqual(Bits(a.ThetaArcsec), Bits(b.ThetaArcsec));
    }

    [Fact]
    public void TheRandomSourceIsFixedByItsSeedAndHasUnitNormalMoments()
    {
        var r1 = new SimulationRandom(42);
        var r2 = new SimulationRandom(42);
        for (int i = 0; i < 100; i++) Assert.Equal(r1.NextUInt64(), r2.NextUInt64());
        var rng = SimulationRandom.ForStream(3, 5);
        var x = new double[50000];
        for (int i = 0; i < x.Length; i++) x[i] = rng.NextGaussian();
        MockStats.AssertNormalMoments(x, 0, 1, "polar-method deviates"); // Marsaglia & Bray 1964: exact N(0,1)
        var u = new double[50000];
        for (int i = 0; i < u.Length; i++) u[i] = rng.NextOpenDouble();
        Assert.All(u, v => Assert.InRange(v, double.Epsilon, 1 - 1e-17));
        // Closed form: U(0,1) has mean 1/2 and sd 1/√12; the mean is within 4σ/√n.
        Assert.InRange(u.Average(), 0.5 - 4 / Math.Sqrt(12 * 50000.0), 0.5 + 4 / Math.Sqrt(12 * 50000.0));
    }

    [Fact]
    public void StreamsOfDifferentChunksDiffer()
    {
        Assert.NotEqual(SimulationRandom.DeriveSeed(1, 0), SimulationRandom.DeriveSeed(1, 1));
        Assert.NotEqual(SimulationRandom.DeriveSeed(1, 0), SimulationRandom.DeriveSeed(2, 0));
    }
}

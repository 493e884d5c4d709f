using Xunit;
using SizeTest.Cosmology;
using SizeTest.Simulation;
using SizeTest.Foundation.Angles;

namespace SizeTest.Tests.Simulation;

/// <summary>Compact radio sources follow θ = ℓ/D_A with ℓ = ℓ_m L^β (1+z)^n (Gurvits, Kellermann &amp; Frey 1999).</summary>
public sealed class CompactSourceTests
{
    private static readonly IWorldModel Lcdm = WorldModels.Get("lcdm").Create(new Dictionary<string, double>());

    private static MockCatalogue Draw(RadioSourcePopulation pop, RedshiftDistribution z, int n = 500, MeasurementErrors? e = null) =>
        MockSurveyGenerator.Generate(new MockSurveySpec(Lcdm, new SurveyDesign(n, z, MockObjectKind.CompactRadio, e ?? new MeasurementErrors(0, 0, 0, 0)), 31, RadioSources: pop));

    [Fact]
    public void RigidRodsHaveThetaEqualToLinearSizeOverDa()
    {
        // Cao et al. 2017 (A&A 606, A15): ℓ_m = 11.03 pc; no scatter, no errors: every source is the rod itself.
        var cat = Draw(new RadioSourcePopulation(LinearSizePc: 11.03, ScatterDex: 0), RedshiftDistribution.Uniform(0.46, 2.76));
        for (int i = 0; i < cat.Count; i++)
        {
            double thetaMas = 11.03 * AngleUnits.ArcsecPerRadian / 1e3 / Lcdm.AngularDiameterDistance(cat.ZTrue[i]); // θ[mas] = ℓ[pc]·206.265/D_A[Mpc]
            Assert.Equal(thetaMas, cat.ThetaArcsec[i] * 1000, thetaMas * 1e-12);
        }
    }

    [Fact]
    public void AtRedshiftOneTheRodSubtendsTheAstropyAngle()
    {
        var cat = Draw(new RadioSourcePopulation(ScatterDex: 0), RedshiftDistribution.Uniform(0.9999999, 1.0000001), 10);
        // Flat ΛCDM H0 = 70, Ωm = 0.3: D_A(1) = 1651.9144 Mpc (reference: astropy 5.2.1, docs/science.md §2.2), so
        // θ = 11.03 pc × 206264.806 / 1651.9144 Mpc = 1.3772510 mas (closed form of the small-angle rule).
        Assert.All(cat.ThetaArcsec, t => Assert.Equal(1.3772510, t * 1000, 2e-6));
    }

    [Fact]
    public void LuminosityAndRedshiftExponentsEnterAsPowerLaws()
    {
        var pop = new RadioSourcePopulation(LuminosityExponent: 0.17, SizeEvolution: -0.3, ScatterDex: 0); // β ≈ 0.17 as Cao et al. 2015 find
        var cat = Draw(pop, RedshiftDistribution.Uniform(0.5, 3), 200);
        for (int i = 0; i < cat.Count; i++)
        {
            // ℓ = ℓ_m (L/L_pivot)^β (1+z)^n (Gurvits, Kellermann & Frey 1999 parametrisation)
            double lPc = 11.03 * Math.Pow(10, 0.17 * (cat.LogLuminosity![i] - 27)) * Math.Pow(1 + cat.ZTrue[i], -0.3);
            Assert.Equal(lPc, cat.SizeKpc[i] * 1000, lPc * 1e-12);
        }
    }

    [Fact]
    public void LinearSizeScatterIsLogNormalWithTheAskedWidth()
    {
        var cat = Draw(new RadioSourcePopulation(ScatterDex: 0.15), RedshiftDistribution.Uniform(0.5, 3), 20000);
        var r = cat.SizeKpc.Select(s => Math.Log10(s * 1000 / 11.03)).ToArray();
        MockStats.AssertNormalMoments(r, 0, 0.15, "log10 ℓ residual"); // definition: log10 ℓ = log10 ℓ_m + 0.15 ε
    }
}

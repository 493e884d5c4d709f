using Xunit;
using SizeTest.Cosmology;
using SizeTest.Simulation;

namespace SizeTest.Tests.Simulation;

/// <summary>The drawn catalogues have the distributions that were asked for.</summary>
public sealed class MockDistributionTests
{
    private const double Ln10 = 2.302585092994046;

    private static MockCatalogue Draw(IWorldModel model, int n, long seed, GalaxyPopulation? g = null, MeasurementErrors? e = null, RedshiftDistribution? z = null) =>
        MockSurveyGenerator.Generate(new MockSurveySpec(model, new SurveyDesign(n, z ?? RedshiftDistribution.Uniform(0.1, 3), Errors: e), seed, g));

    [Theory]
    [InlineData("lcdm")]
    [InlineData("tired-light")]
    public void SizeResidualsHaveTheAskedMeanAndScatter(string family)
    {
        var model = WorldModels.Get(family).Create(new Dictionary<string, double>());
        var g = new GalaxyPopulation(R0Kpc: 4, SizeEvolution: -1.2, ScatterDex: 0.2);
        var cat = Draw(model, 20000, 11, g);
        var r = new double[cat.Count];
        for (int i = 0; i < cat.Count; i++)
        {
            double z = cat.ZTrue[i];
            double thetaModel = model.AngularSizeArcsec(z, g.R0Kpc * Math.Pow(1 + z, g.SizeEvolution));
            r[i] = Math.Log(cat.ThetaArcsec[i]) - Math.Log(thetaModel);
        }
        // Closed form: ln θ_obs − ln θ_model = ln10 σ_R ε₁ + σ_ln ε₃, so the sd is √((ln10·0.2)² + 0.05²) (defaults: f = 0.05, no floor).
        MockStats.AssertNormalMoments(r, 0, Math.Sqrt(Math.Pow(Ln10 * 0.2, 2) + 0.05 * 0.05), "ln θ residual");
    }

    [Fact]
    public void SizeErrorFloorIsSetByTheMedianSizeAtZNotByTheObject()
    {
        var model = WorldModels.Get("lcdm").Create(new Dictionary<string, double>());
        var g = new GalaxyPopulation(R0Kpc: 4, SizeEvolution: -1.2, ScatterDex: 0.2);
        var cat = Draw(model, 20000, 15, g, new MeasurementErrors(0.05, SizeErrorFloorArcsec: 0.1));
        var quoted = new double[cat.Count];
        var own = new double[cat.Count];
        for (int i = 0; i < cat.Count; i++)
        {
            double z = cat.ZTrue[i];
            double thetaMedian = model.AngularSizeArcsec(z, g.R0Kpc * Math.Pow(1 + z, g.SizeEvolution));
            // Closed form (docs/simulation.md): theta_err/theta = σ_ln = √(f² + (floor/θ_med(z))²), θ_med = R0 (1+z)^a / D_A.
            double expected = Math.Sqrt(0.05 * 0.05 + 0.1 * 0.1 / (thetaMedian * thetaMedian));
            quoted[i] = cat.ThetaErrArcsec[i] / cat.ThetaArcsec[i];
            Assert.Equal(expected, quoted[i], 1e-12); // relative 1e-12: the same formula, evaluated twice
            own[i] = Math.Log(cat.ThetaTrueArcsec[i] / thetaMedian);
        }
        // The quoted error must not carry θ_true: its correlation with ln(θ_true/θ_med) is 0 within 4 standard errors (1/√n,
        // Fisher 1915). A floor taken from θ_true gives ρ = −0.67 on this mock.
        double rho = MockStats.Correlation(quoted, own);
        Assert.InRange(rho, -4 / Math.Sqrt(cat.Count), 4 / Math.Sqrt(cat.Count));
    }

    [Theory]
    [InlineData("lcdm", 4.0)]           // Tolman 1930: n = 4 for every FLRW model
    [InlineData("static-linear", 1.0)]  // static, energy loss only: n = 1 (the family's default)
    public void SurfaceBrightnessResidualsHaveTheAskedMeanAndScatter(string family, double n)
    {
        var model = WorldModels.Get(family).Create(new Dictionary<string, double>());
        Assert.Equal(n, model.BolometricDimmingExponent);
        var g = new GalaxyPopulation(Mu0: 20.5, SbEvolution: 1.3, ScatterMag: 0.25);
        var cat = Draw(model, 20000, 12, g, new MeasurementErrors(MuErrorMag: 0.15));
        var r = new double[cat.Count];
        for (int i = 0; i < cat.Count; i++)
            r[i] = cat.Mu![i] - (g.Mu0 + 2.5 * (n - g.SbEvolution) * Math.Log10(1 + cat.ZTrue[i]));
        // Closed form: μ residual = σ_μ ε₂ + σ_err ε₄, sd √(0.25² + 0.15²).
        MockStats.AssertNormalMoments(r, 0, Math.Sqrt(0.25 * 0.25 + 0.15 * 0.15), "μ residual");
    }

    [Fact]
    public void KormendySlopeCorrelatesSizeAndSurfaceBrightness()
    {
        var model = WorldModels.Get("eds").Create(new Dictionary<string, double>());
        var g = new GalaxyPopulation(ScatterDex: 0.2, ScatterMag: 0.3, KormendySlope: 3.0);
        var cat = Draw(model, 20000, 13, g, new MeasurementErrors(0, 0, 0, 0));
        var x = new double[cat.Count];
        var y = new double[cat.Count];
        for (int i = 0; i < cat.Count; i++)
        {
            double z = cat.ZTrue[i];
            double meanLog10R = Math.Log10(g.R0Kpc) + g.SizeEvolution * Math.Log10(1 + z);
            x[i] = Math.Log10(cat.SizeKpc[i]) - meanLog10R;
            y[i] = cat.Mu![i] - (g.Mu0 + 2.5 * (4 - g.SbEvolution) * Math.Log10(1 + z) + g.KormendySlope * (meanLog10R - Math.Log10(g.PivotSizeKpc)));
        }
        // Closed form: y = κ x + σ_μ ε₂ with x ~ N(0, σ_R²): ρ = κσ_R / √(κ²σ_R² + σ_μ²) = 0.6/√(0.36+0.09) = 0.8944.
        double rho = 0.6 / Math.Sqrt(0.36 + 0.09);
        double se = (1 - rho * rho) / Math.Sqrt(cat.Count); // large-n standard error of a correlation (Fisher 1915; common practice)
        Assert.InRange(MockStats.Correlation(x, y), rho - 4 * se, rho + 4 * se);
    }

    [Fact]
    public void UniformRedshiftsHaveTheUniformMoments()
    {
        var model = WorldModels.Get("lcdm").Create(new Dictionary<string, double>());
        var cat = Draw(model, 20000, 14, z: RedshiftDistribution.Uniform(0.2, 2.2));
        Assert.All(cat.ZTrue, z => Assert.InRange(z, 0.2, 2.2));
        // Closed form: U(a, b) has mean (a+b)/2 = 1.2 and sd (b−a)/√12; the sample mean is normal to 4σ at this n.
        var (m, _) = MockStats.MeanSd(cat.ZTrue);
        Assert.InRange(m, 1.2 - 4 * (2.0 / Math.Sqrt(12)) / Math.Sqrt(20000), 1.2 + 4 * (2.0 / Math.Sqrt(12)) / Math.Sqrt(20000));
    }

    [Fact]
    public void SurveyRedshiftsPeakWhereAskedAndFollowTheirCdf()
    {
        var dist = RedshiftDistribution.Survey(1.0);
        // Closed form: N(z) ∝ z² exp(−(z/z0)^1.5) peaks at z = (4/3)^(2/3) z0, which the factory sets to 1.0.
        double best = 0, bestZ = 0;
        for (double z = 0.5; z < 1.5; z += 0.001)
            if (dist.Density(z) > best) { best = dist.Density(z); bestZ = z; }
        Assert.InRange(bestZ, 0.99, 1.01);
        var model = WorldModels.Get("lcdm").Create(new Dictionary<string, double>());
        var cat = Draw(model, 20000, 15, z: dist);
        // The fraction below each quartile of the tabulated CDF is binomial: within 4√(p(1−p)/n) (common practice).
        foreach (double q in new[] { 0.25, 0.5, 0.75 })
        {
            double zq = Bisect(dist, q);
            double frac = cat.ZTrue.Count(z => z <= zq) / (double)cat.Count;
            Assert.InRange(frac, q - 4 * Math.Sqrt(q * (1 - q) / cat.Count), q + 4 * Math.Sqrt(q * (1 - q) / cat.Count));
        }
    }

    [Fact]
    public void HistogramRedshiftsFillTheirBinsInProportion()
    {
        var dist = RedshiftDistribution.Histogram([0.1, 0.5, 1.0, 2.0], [1, 0, 3]);
        var model = WorldModels.Get("lcdm").Create(new Dictionary<string, double>());
        var cat = Draw(model, 20000, 16, z: dist);
        Assert.DoesNotContain(cat.ZTrue, z => z > 0.5 && z < 1.0); // the empty bin stays empty
        double frac = cat.ZTrue.Count(z => z < 0.5) / (double)cat.Count;
        // Binomial, p = 1/4, within 4σ (common practice).
        Assert.InRange(frac, 0.25 - 4 * Math.Sqrt(0.25 * 0.75 / 20000), 0.25 + 4 * Math.Sqrt(0.25 * 0.75 / 20000));
    }

    [Fact]
    public void PhotometricRedshiftErrorsHaveTheAskedScatter()
    {
        var model = WorldModels.Get("lcdm").Create(new Dictionary<string, double>());
        var cat = Draw(model, 20000, 17, e: new MeasurementErrors(PhotoZError: 0.03), z: RedshiftDistribution.Uniform(0.5, 2.5));
        Assert.NotNull(cat.ZErr);
        var d = cat.Z.Select((z, i) => (z - cat.ZTrue[i]) / (1 + cat.ZTrue[i])).ToArray();
        // Definition: z_obs = z_true + σ(1+z_true) ε; truncation at z_obs > 0 is 16σ away here, so the moments are those of N(0, 0.03²).
        MockStats.AssertNormalMoments(d, 0, 0.03, "photo-z residual");
    }

    private static double Bisect(RedshiftDistribution d, double q)
    {
        double lo = d.ZMin, hi = d.ZMax;
        for (int k = 0; k < 60; k++)
        {
            double mid = 0.5 * (lo + hi);
            if (d.Cumulative(mid) < q) lo = mid; else hi = mid;
        }
        return 0.5 * (lo + hi);
    }
}

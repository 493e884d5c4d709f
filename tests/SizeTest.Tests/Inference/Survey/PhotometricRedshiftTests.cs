using System.Globalization;
using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Inference.Survey;
using SizeTest.Simulation;
using Xunit;
using static SizeTest.Tests.Inference.Survey.SurveyFitting;

namespace SizeTest.Tests.Inference.Survey;

/// <summary>Photometric redshifts: the bias of ignoring z_err and its removal by marginalisation, with interval coverage; the quadrature against stored values.</summary>
public sealed class PhotometricRedshiftTests(Xunit.Abstractions.ITestOutputHelper output)
{
    private static readonly IWorldModel Lcdm = new LambdaCdmModel(70, 0.3);

    /// <summary>Mocks in the coverage study (CI size; the full 200-mock run is SIZETEST_FULL_COVERAGE=1).</summary>
    private static int Mocks => Environment.GetEnvironmentVariable("SIZETEST_FULL_COVERAGE") == "1" ? 200 : 100;

    private static global::SizeTest.Simulation.MockCatalogue Mock(int n, long seed) =>
        // z_true uniform on [0.3, 2] (the prior the fit states: flat in z), σ_z = 0.08 (1+z), 5% log-normal size errors.
        Draw(Lcdm, n, seed, zDist: "uniform:0.3:2", errors: new MeasurementErrors(0.05, MuErrorMag: 0, PhotoZError: 0.08));

    [Fact]
    public void IgnoringPhotometricRedshiftErrorsBiasesTheEvolutionAndMarginalisingRemovesIt()
    {
        var obs = Mock(4000, 31).ToObservables();
        var (ignored, _) = Fit(WorldModels.LambdaCdm, obs, null);
        var (marg, lik) = Fit(WorldModels.LambdaCdm, obs, new SurveyModel(MarginaliseRedshift: true, RedshiftPriorMin: 0.3, RedshiftPriorMax: 2));
        var a0 = Est(ignored, "size_evolution");
        var a1 = Est(marg, "size_evolution");
        output.WriteLine($"ignored: a = {a0.Value:F3} [{a0.Lo:F3}, {a0.Hi:F3}]; marginalised: a = {a1.Value:F3} [{a1.Lo:F3}, {a1.Hi:F3}]");
        Assert.False(Within(a0, -1.0, 3), $"ignoring z_err should bias a: {a0.Value}");
        Assert.True(Within(a1, -1.0, 2), $"marginalised a = {a1.Value}");
        Assert.Contains(lik.SurveyNotes, n => n.Contains("flat prior in z", StringComparison.Ordinal));
    }

    [Fact]
    public void MarginalisedIntervalsCoverTheTruthAtTheirNominalRate()
    {
        // Coverage of the 68.3% Hessian interval of a over independent mocks of 400 objects: with 100 mocks the binomial
        // standard error is √(0.683·0.317/100) = 0.047, so 61–75% is the ±1.5σ band the issue asks for (common practice).
        int hits = 0, hitsIgnored = 0, m = Mocks;
        for (int k = 0; k < m; k++)
        {
            var obs = Mock(400, 1000 + k).ToObservables();
            var (s, _) = Fit(WorldModels.LambdaCdm, obs, new SurveyModel(MarginaliseRedshift: true, RedshiftPriorMin: 0.3, RedshiftPriorMax: 2));
            if (Within(Est(s, "size_evolution"), -1.0)) hits++;
            var (s0, _) = Fit(WorldModels.LambdaCdm, obs, null);
            if (Within(Est(s0, "size_evolution"), -1.0)) hitsIgnored++;
        }
        double cov = (double)hits / m, cov0 = (double)hitsIgnored / m;
        output.WriteLine($"coverage over {m} mocks: marginalised {cov:P1}, ignoring z_err {cov0:P1}");
        Assert.InRange(cov, 0.61, 0.75);
    }

    // The photometric-redshift quadrature's ln L and gradient against stored values of the per-node implementation it replaced
    // (SurveySizeLikelihood.Accumulate at 55579f4: per node ln W + ln N(y; m, V), log-sum-exp shifted by the largest node, partials
    // mapped to the free parameters per node). The block-vectorised RedshiftQuadratureKernel sums the same terms in
    // another order, so agreement to 10⁻¹² relative (ln L) and 10⁻¹² (|g| + 1) (gradient; measured 10⁻¹⁵) shows it computes the same integral.
    // Cases: free Ωm with a prior narrower than the data (dropped nodes and Gauss–Legendre objects), a fixed cosmology with a
    // size–luminosity relation and two groups, radio flux densities (luminosity moving with the node's z), and a static model with
    // its free luminosity exponent. Set SIZETEST_PRINT_QUADRATURE=1 to print the values (how they were recorded).
    private static HypothesisLikelihood Bind(string kind)
    {
        var pops = new[] { new MockSubpopulation("early", 0.5, 3, -1.5, 0.2, 0.15), new MockSubpopulation("late", 0.5, 6, -0.75, 0.3, 0.2) };
        var lf = new SchechterLuminosityFunction();
        var pz = new MeasurementErrors(0.05, MuErrorMag: 0, PhotoZError: 0.08);
        var (mock, sv, family, free) = kind switch
        {
            "prior" => (Draw(Lcdm, 300, 7, "uniform:0.3:2", errors: pz),
                new SurveyModel(MarginaliseRedshift: true, RedshiftPriorMin: 0.5, RedshiftPriorMax: 1.8), WorldModels.LambdaCdm, "omega_m"),
            "groups" => (Draw(Lcdm, 300, 8, "uniform:0.3:2", errors: pz, survey: new SurveyPopulation(lf, Populations: pops)),
                new SurveyModel(SizeRelationKind.Luminosity, Groups: ["early", "late"], MarginaliseRedshift: true, RedshiftNodes: 5), WorldModels.LambdaCdm, ""),
            "radio" => (Draw(Lcdm, 300, 9, "uniform:0.4:2.5", errors: pz, kind: MockObjectKind.CompactRadio, radio: new RadioSourcePopulation(LuminosityExponent: 0.1)),
                new SurveyModel(SizeRelationKind.Luminosity, MarginaliseRedshift: true), WorldModels.LambdaCdm, "omega_m"),
            _ => (Draw(Lcdm, 300, 10, "uniform:0.3:2", errors: pz, survey: new SurveyPopulation(lf, SizeLuminositySlope: 0.3)),
                new SurveyModel(SizeRelationKind.Luminosity, MarginaliseRedshift: true, RedshiftNodes: 9), WorldModels.Get("static-linear"), "luminosity_exponent"),
        };
        var overrides = new ParameterOverrides(Free: free.Length == 0 ? null : new HashSet<string> { free });
        return Hypothesis.Create(family, new NuisanceModel(ObservableKind.Size, Survey: sv), overrides).Bind(mock.ToObservables());
    }

    // ln L, then the gradient, at the suggested start moved by +3% (at least 0.02) in every free parameter.
    private static readonly Dictionary<string, double[]> Stored = new()
    {
        ["prior"] = [-243.84066944024772, -34.00963269511166, 5.457680576151736, -48.29071383339799, 179.68727753650435],
        ["groups"] = [-260.8177574218861, 14.072879868254955, -34.3641581017029, -2.4618953158412364, 144.61349564321276, -3.886624561635915, -42.611102552566265, 291.08845929144655, 276.812957407289],
        ["radio"] = [-779.3150817263479, -799.3856096965848, -40669.26407554599, -1081.5289466568404, 4955.981387944142, 287.8093618438473],
        ["static"] = [-300.2515976608737, 0.0895049108742454, -7.494646889388013, 2.237622771856144, 501.7885957466855, 656.0034375655969],
    };

    [Theory]
    [InlineData("prior")]
    [InlineData("groups")]
    [InlineData("radio")]
    [InlineData("static")]
    public void LogLikelihoodAndGradientEqualThePerNodeImplementation(string kind)
    {
        var lik = Bind(kind);
        var t = SizeTest.Tests.Inference.GradientTests.OffMaximum(lik);
        var fp = lik.Hypothesis.FreeParameters;
        var g = new double[t.Length];
        double v = lik.LogDensityAndGradient(t, g);
        double[] got = [v, .. g];
        output.WriteLine($"[\"{kind}\"] = [{string.Join(", ", got.Select(x => x.ToString("R", CultureInfo.InvariantCulture)))}],");
        if (Environment.GetEnvironmentVariable("SIZETEST_PRINT_QUADRATURE") == "1") return;
        var want = Stored[kind];
        Assert.Equal(want.Length, got.Length);
        Assert.True(Math.Abs(got[0] - want[0]) <= 1e-12 * Math.Abs(want[0]), $"{kind}: ln L {got[0]:R}, stored {want[0]:R}");
        Assert.Equal(lik.LogDensity(t), v, 9);
        for (int j = 1; j < got.Length; j++)
            Assert.True(Math.Abs(got[j] - want[j]) <= 1e-12 * (Math.Abs(want[j]) + 1), $"{kind}: {fp[j - 1].Name}: {got[j]:R}, stored {want[j]:R}");
    }
}

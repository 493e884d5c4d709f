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
        Assert.Contains(lik.SurveyNotes, n => n.Contains("flat in z", StringComparison.Ordinal));
    }

    [Fact]
    public void MarginalisedIntervalsCoverTheTruthAtTheirNominalRate()
    {
        // Both marginals (quadrature and the linearised z_marginal = linear) on the same mocks.
        // Coverage of the 68.3% Hessian interval of a over independent mocks of 400 objects: with 100 mocks the binomial
        // standard error is √(0.683·0.317/100) = 0.047, so 61–75% is the ±1.5σ band the issue asks for (common practice).
        int hits = 0, hitsIgnored = 0, hitsLinear = 0, m = Mocks;
        double biasLinear = 0, biasQuadrature = 0, halfWidth = 0;
        for (int k = 0; k < m; k++)
        {
            var obs = Mock(400, 1000 + k).ToObservables();
            var (s, _) = Fit(WorldModels.LambdaCdm, obs, new SurveyModel(MarginaliseRedshift: true, RedshiftPriorMin: 0.3, RedshiftPriorMax: 2));
            var aq = Est(s, "size_evolution");
            if (Within(aq, -1.0)) hits++;
            biasQuadrature += aq.Value + 1.0;
            halfWidth += 0.5 * (aq.Hi - aq.Lo);
            var (sl, _) = Fit(WorldModels.LambdaCdm, obs, new SurveyModel(MarginaliseRedshift: true, RedshiftPriorMin: 0.3, RedshiftPriorMax: 2, ZMarginal: RedshiftMarginal.Linear));
            var al = Est(sl, "size_evolution");
            if (Within(al, -1.0)) hitsLinear++;
            biasLinear += al.Value + 1.0;
            var (s0, _) = Fit(WorldModels.LambdaCdm, obs, null);
            if (Within(Est(s0, "size_evolution"), -1.0)) hitsIgnored++;
        }
        double cov = (double)hits / m, cov0 = (double)hitsIgnored / m, covL = (double)hitsLinear / m;
        output.WriteLine($"coverage over {m} mocks: marginalised {cov:P1} (mean a − truth {biasQuadrature / m:+0.000;-0.000}), linearised {covL:P1} ({biasLinear / m:+0.000;-0.000}), ignoring z_err {cov0:P1}; mean 68% half-width {halfWidth / m:0.000}");
        Assert.InRange(cov, 0.61, 0.75);
        Assert.InRange(covL, 0.61, 0.75);
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

    // ln L, then the gradient, at the suggested start moved by +3% (at least 0.02) in every free parameter. Re-recorded (2026-12-04)
    // when objects whose redshift normal the prior cuts moved from dropped Hermite nodes to the truncated-normal rule (their nodes
    // and weights changed, the kernel did not; that rule is checked against scipy in TruncatedPriorQuadratureCliTests).
    private static readonly Dictionary<string, double[]> Stored = new()
    {
        ["prior"] = [-242.47653893249714, -36.196333277926456, 4.426471144314766, -51.0254547218643, 166.63322730976853],
        ["groups"] = [-260.47498364237043, 12.313857049966357, -35.03295632570911, -14.978148007602012, 141.08836177032296, -2.830669695011817, -41.75071911819572, 297.65936368135806, 273.8984261811669],
        ["radio"] = [-779.5914409076854, -799.2815533872839, -40690.203195737464, -1081.508278876098, 4961.2761225807235, 290.19918095202365],
        ["static"] = [-300.1525292622717, 0.0748518215487404, -7.590609565982567, 1.871295538718518, 501.28065332211787, 656.6758397598586],
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

    // The linearised marginal (z_marginal = linear), hand-computed: flat ΛCDM (Ωm = 0.3, no radiation, held fixed) with a prior far
    // wider than every object's Gaussian, so z̄ = z_obs and s = z_err, and ln p_i = ln N(ln θ_i; m_i, σ_i² + σ² + m′_i² z_err_i²) with
    // m = ln(10⁻³ R0) + a ln(1+z) − ln D_A, m′ = a/(1+z) − d ln D_A/dz and, for D_A = D_C/(1+z), dD_C/dz = D_H/E(z),
    // E = √(Ωm(1+z)³ + 1 − Ωm) (Hogg 1999, astro-ph/9905116, eqs. 14–15, 18): d ln D_A/dz = D_H/(E D_C) − 1/(1+z).
    // The same with Ωm free runs on the D_A grid and its interpolant's slope (RedshiftGridSlope): within the grid's accuracy.
    [Theory]
    [InlineData(false, 1e-9)]
    [InlineData(true, 2e-6)]
    public void LinearisedMarginalIsTheEffectiveVarianceClosedForm(bool freeCosmology, double tolerance)
    {
        var obs = Draw(Lcdm, 300, 21, zDist: "uniform:0.5:1.5", errors: new MeasurementErrors(0.05, MuErrorMag: 0, PhotoZError: 0.03)).ToObservables();
        var sv = new SurveyModel(MarginaliseRedshift: true, RedshiftPriorMin: 0.01, RedshiftPriorMax: 6, ZMarginal: RedshiftMarginal.Linear);
        var overrides = new ParameterOverrides(Free: freeCosmology ? new HashSet<string> { "omega_m" } : null);
        var lik = Hypothesis.Create(WorldModels.LambdaCdm, new NuisanceModel(ObservableKind.Size, Survey: sv), overrides).Bind(obs);
        var fp = lik.Hypothesis.FreeParameters;
        var t = fp.Select(p => p.Name switch { "r0_kpc" => 5.0, "size_evolution" => -1.0, "scatter_dex" => 0.1, "omega_m" => 0.3, _ => throw new InvalidOperationException(p.Name) }).ToArray();
        double got = lik.LogDensity(t);
        var flat = new LambdaCdmModel(70, 0.3);
        double dh = flat.HubbleDistance, want = 0;
        for (int i = 0; i < obs.Count; i++)
        {
            double z = obs.Z[i], zerr = obs.Survey.ZErr![i], s2 = obs.LnThetaErr![i] * obs.LnThetaErr[i];
            double e = Math.Sqrt(0.3 * Math.Pow(1 + z, 3) + 0.7), dc = flat.ComovingDistance(z);
            double m = Math.Log(1e-3 * 5.0) - Math.Log(1 + z) - Math.Log(dc / (1 + z));
            double slope = -1 / (1 + z) - (dh / (e * dc) - 1 / (1 + z));
            double sig = Math.Log(10) * 0.1, v = s2 + sig * sig + slope * slope * zerr * zerr, r = obs.LnTheta![i] - m;
            want += -0.5 * (r * r / v + Math.Log(2 * Math.PI * v));
        }
        output.WriteLine($"free cosmology {freeCosmology}: ln L {got:R}, closed form {want:R}, relative {Math.Abs(got / want - 1):E2}");
        Assert.True(Math.Abs(got - want) <= tolerance * Math.Abs(want), $"ln L {got:R}, closed form {want:R}");
    }

    // Why the linearised marginal can be exact: for a mean linear in z, m(z) = m0 + κ(z − z0), the Gaussian convolution
    // ∫ N(y; m(z), V) N(z; z0, σz²) dz = N(y; m0, V + κ²σz²) (the effective variance). The 40-node quadrature kernel on such a mean
    // (a = β = 0 and ln D_A = −κ z at the nodes) reproduces it.
    [Fact]
    public void TheEffectiveVarianceIsTheExactConvolutionOfALinearMean()
    {
        const int J = 40, n = 5;
        double kappa = 1.3, lnR0 = -4.0, sig = 0.25;
        var gh = new GaussHermite(J);
        double[] z0 = [1.4, 1.8, 2.1, 2.6, 3.3], zs = [0.05, 0.1, 0.1, 0.15, 0.2], y = [-3.2, -2.6, -2.9, -1.8, -3.9], s2 = [0.01, 0.0025, 0.04, 0.0, 0.01];
        var ln1pz = new double[n * J];
        var lnz = new double[n * J];
        var logW = new double[n * J];
        var lnDa = new double[n * J];
        for (int i = 0; i < n; i++)
            for (int j = 0; j < J; j++)
            {
                int q = i * J + j;
                double z = z0[i] + Math.Sqrt(2) * zs[i] * gh.Nodes[j];
                ln1pz[q] = Math.Log(1 + z);
                lnz[q] = Math.Log(z); // z > 0 at every node: z0 > √2 σz x_max (x_max = 8.1 for 40 nodes)
                logW[q] = Math.Log(gh.Weights[j] / Math.Sqrt(Math.PI));
                lnDa[q] = -kappa * z;
            }
        var kernel = new RedshiftQuadratureKernel(J, y, s2, new int[n], new int[n], null, ln1pz, lnz, logW, null, lnDa, null);
        double dExp = 0;
        double got = kernel.Sum([lnR0], [0.0], [0.0], [sig], 2.0, null, 0, n, default, default, default, default, ref dExp, null);
        double want = 0;
        for (int i = 0; i < n; i++)
        {
            double v = s2[i] + sig * sig + kappa * kappa * zs[i] * zs[i], r = y[i] - (lnR0 + kappa * z0[i]);
            want += -0.5 * (r * r / v + Math.Log(2 * Math.PI * v));
        }
        Assert.True(Math.Abs(got - want) <= 1e-10 * Math.Abs(want), $"quadrature {got:R}, effective variance {want:R}");
    }

    // Where the prior cuts an object's Gaussian, the linearised marginal is centred on the truncated normal's mean with its
    // variance: α = (lo − z)/σ, β = (hi − z)/σ, Z = Φ(β) − Φ(α), mean z + σ(φ(α) − φ(β))/Z, variance
    // σ²[1 + (αφ(α) − βφ(β))/Z − ((φ(α) − φ(β))/Z)²] (Johnson, Kotz & Balakrishnan 1994, Continuous Univariate Distributions 1, §10.1).
    [Fact]
    public void ACutPosteriorIsSummarisedByTheTruncatedNormalMoments()
    {
        double[] z = [0.35, 1.0, 1.95, 2.2, 0.9], err = [0.1, 0.01, 0.2, 0.15, 0.0];
        var centre = new double[z.Length];
        var variance = SurveyRows.LinearisedCentres(z, err, 0.3, 2.0, centre, out int cut);
        Assert.Equal(3, cut);
        for (int i = 0; i < z.Length; i++)
        {
            double s = err[i], wantMean = z[i], wantVar = s * s;
            if (s > 0 && i != 1)
            {
                double a = (0.3 - z[i]) / s, b = (2.0 - z[i]) / s, pa = Math.Exp(-0.5 * a * a) / Math.Sqrt(2 * Math.PI), pb = Math.Exp(-0.5 * b * b) / Math.Sqrt(2 * Math.PI);
                double zz = NormalMath.Phi(b) - NormalMath.Phi(a), d = (pa - pb) / zz;
                wantMean = z[i] + s * d;
                wantVar = s * s * (1 + (a * pa - b * pb) / zz - d * d);
            }
            Assert.True(Math.Abs(centre[i] - wantMean) <= 1e-12, $"object {i}: mean {centre[i]:R}, closed form {wantMean:R}");
            Assert.True(Math.Abs(variance[i] - wantVar) <= 1e-12 * Math.Max(wantVar, 1e-12), $"object {i}: variance {variance[i]:R}, closed form {wantVar:R}");
        }
        // Far outside the prior (Z < 10⁻⁸) the closed form cancels; the window quadrature takes over. There the truncated normal is
        // nearly exponential from the nearer end, rate d/σ² (d the distance beyond it; Mills' ratio): mean hi − σ²/d, sd σ²/d.
        // z = 2.8, σ = 0.1, hi = 2: σ²/d = 0.0125 (to 1/(d/σ)² ≈ 2% at d = 8σ; 10% allowed).
        var far = new double[1];
        var farVar = SurveyRows.LinearisedCentres([2.8], [0.1], 0.3, 2.0, far, out _);
        Assert.InRange(2.0 - far[0], 0.9 * 0.0125, 1.1 * 0.0125);
        Assert.InRange(Math.Sqrt(farVar[0]), 0.8 * 0.0125, 1.2 * 0.0125);
    }

    // The linearised marginal against the quadrature on the cost harness's design (2000 objects, σ_z = 0.08(1+z), prior [0.3, 2],
    // Ωm free). The quadrature has converged at 20 nodes (40 nodes: the same a and Ωm to 10⁻⁴). Measured: the linearised a lies
    // 0.107 half-widths from it, Ωm 0.071; the default 7 nodes 0.049 and 0.055 half-widths. (Before objects cut by the prior took the
    // truncated-normal rule, the 7-node quadrature dropped their outside nodes and agreed with the linearised a to 0.01 half-widths,
    // both 0.1 half-widths from the converged value.) Bounds: a fifth of a half-width for the approximation, a tenth for 7 nodes.
    [Fact]
    public void LinearisedAndQuadratureMarginalsAgreeOnAPhotometricMock()
    {
        var obs = Mock(2000, 31).ToObservables();
        var free = new ParameterOverrides(Free: new HashSet<string> { "omega_m" });
        var sv = new SurveyModel(MarginaliseRedshift: true, RedshiftPriorMin: 0.3, RedshiftPriorMax: 2);
        var (q, _) = Fit(WorldModels.LambdaCdm, obs, sv with { RedshiftNodes = 20 }, free);
        var (q7, _) = Fit(WorldModels.LambdaCdm, obs, sv, free);
        var (l, lik) = Fit(WorldModels.LambdaCdm, obs, sv with { ZMarginal = RedshiftMarginal.Linear }, free);
        foreach (var name in new[] { "size_evolution", "omega_m" })
        {
            var (eq, e7, el) = (Est(q, name), Est(q7, name), Est(l, name));
            double half = 0.5 * (eq.Hi - eq.Lo);
            output.WriteLine($"{name}: quadrature (20 nodes) {eq.Value:F4} [{eq.Lo:F4}, {eq.Hi:F4}], 7 nodes {e7.Value:F4}: {Math.Abs(e7.Value - eq.Value) / half:F3} σ, linearised {el.Value:F4}: {Math.Abs(el.Value - eq.Value) / half:F3} σ");
            Assert.True(Math.Abs(el.Value - eq.Value) <= 0.2 * half, $"{name}: linearised {el.Value}, quadrature {eq.Value}, half-width {half}");
            Assert.True(Math.Abs(e7.Value - eq.Value) <= 0.1 * half, $"{name}: 7 nodes {e7.Value}, 20 nodes {eq.Value}, half-width {half}");
        }
        Assert.Contains(lik.SurveyNotes, n => n.Contains("linearised marginal", StringComparison.Ordinal));
    }
}

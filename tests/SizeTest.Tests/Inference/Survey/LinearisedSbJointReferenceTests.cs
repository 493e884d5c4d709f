using System.Globalization;
using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Inference.Survey;
using SizeTest.Photometry;
using Xunit;

namespace SizeTest.Tests.Inference.Survey;

/// <summary>
/// The linearised photo-z marginal of the surface-brightness and joint survey kernel (RedshiftMarginal.Linear: each object at the mean
/// z̄ of its redshift posterior on the prior, covariance C + s² g gᵀ with g = ∂(m_t, m_μ)/∂z) against an independent computation of the
/// same likelihood: Reference/Inference/photoz_linearised_sb_joint.py (numpy 1.24.2, scipy 1.10.1 truncnorm and multivariate_normal,
/// astropy 5.2.1 FlatLambdaCDM with its exact d ln D_A/dz; gradient by Richardson-extrapolated central differences) on the committed
/// 60-object mock photoz_linearised_sb_joint_mock.csv, flat prior [0.3, 2]. Cases: sb alone (the vectorised LinearisedRedshiftKernel),
/// sb with an SB limit and joint with a magnitude limit (the per-object path, truncation with the effective covariance), joint with
/// the size–SB relation, and joint with the magnitude limit at Ωm = 0.32 fixed and free (D_A and its slope from the redshift grid).
/// </summary>
public sealed class LinearisedSbJointReferenceTests
{
    private static readonly string Dir = Path.Combine(AppContext.BaseDirectory, "Reference", "Inference");

    private static Observables Mock()
    {
        var rows = File.ReadLines(Path.Combine(Dir, "photoz_linearised_sb_joint_mock.csv")).Skip(1)
            .Select(l => l.Split(',').Select(c => double.Parse(c, CultureInfo.InvariantCulture)).ToArray()).ToArray();
        double rad = SizeTest.Foundation.Angles.AngleUnits.RadiansPerArcsec;
        return new Observables(rows.Select(r => r[0]).ToArray(), rows.Select(r => Math.Log(r[2] * rad)).ToArray(), rows.Select(r => r[3]).ToArray(),
            rows.Select(r => r[4]).ToArray(), rows.Select(r => r[5]).ToArray(), survey: new SurveyObservables(ZErr: rows.Select(r => r[1]).ToArray()));
    }

    private static Dictionary<string, double> Reference(string kase) =>
        File.ReadLines(Path.Combine(Dir, "photoz_linearised_sb_joint.txt")).Where(l => l.StartsWith(kase + " ", StringComparison.Ordinal))
            .Select(l => l.Split(' ')).ToDictionary(p => p[1], p => double.Parse(p[2], CultureInfo.InvariantCulture));

    private static readonly Dictionary<string, double> Values = new()
    {
        ["r0_kpc"] = 4.5, ["size_evolution"] = -0.8, ["scatter_dex"] = 0.18, ["mu0"] = 21.2, ["sb_evolution"] = 0.9, ["scatter_mag"] = 0.28,
        ["kormendy_slope"] = 0.4, ["omega_m"] = 0.32,
    };

    [Theory]
    [InlineData("sb", 1e-9)]
    [InlineData("sb_sblimit", 1e-9)]
    [InlineData("joint_kormendy", 1e-9)]
    [InlineData("joint_maglimit", 1e-9)]
    [InlineData("joint_maglimit_omega", 3e-6)]
    public void LogLikelihoodAndGradientMatchScipy(string kase, double tolerance)
    {
        // Fixed cosmology (Ωm 0.3, or 0.32 for the magnitude limit): ln D_A exact, its slope by a central difference (step 10⁻⁴ z);
        // free Ωm: the redshift grid's interpolant and its derivative (RedshiftGridSlope): measured 1.2·10⁻⁶ relative in ∂/∂scatter_dex
        // against within 10⁻⁹ at the same Ωm fixed, so the grid's. The scipy gradient's own error is ~10⁻⁸ relative (steps 10⁻³ and 10⁻⁴ agree).
        var kind = kase.StartsWith("sb", StringComparison.Ordinal) ? ObservableKind.SurfaceBrightness : ObservableKind.Joint;
        var limits = kase switch
        {
            "sb_sblimit" => new SelectionLimits(SbLimit: 23.5),
            "joint_maglimit" or "joint_maglimit_omega" => new SelectionLimits(MagLimit: 25),
            _ => null,
        };
        var sv = new SurveyModel(MarginaliseRedshift: true, RedshiftPriorMin: 0.3, RedshiftPriorMax: 2, ZMarginal: RedshiftMarginal.Linear);
        var nuisance = new NuisanceModel(kind, limits, SizeSbRelation: kase == "joint_kormendy", Survey: sv);
        var overrides = kase switch
        {
            "joint_maglimit_omega" => new ParameterOverrides(Free: new HashSet<string> { "omega_m" }),
            "joint_maglimit" => new ParameterOverrides(Fixed: new Dictionary<string, double> { ["omega_m"] = 0.32 }),
            _ => null,
        };
        var lik = Hypothesis.Create(WorldModels.LambdaCdm, nuisance, overrides).Bind(Mock());
        Assert.Contains(lik.SurveyNotes, n => n.Contains("linearised marginal", StringComparison.Ordinal));
        var names = lik.Hypothesis.FreeParameters.Select(p => p.Name).ToArray();
        var theta = names.Select(n => Values[n]).ToArray();
        var grad = new double[theta.Length];
        double value = lik.LogDensityAndGradient(theta, grad);
        var r = Reference(kase);
        Assert.True(Math.Abs(value - r["lnL"]) <= tolerance * (Math.Abs(r["lnL"]) + 1), $"ln L {value:R} vs scipy {r["lnL"]:R}");
        Assert.Equal(r.Count - 1, names.Length);
        for (int j = 0; j < names.Length; j++)
        {
            double expected = r["d_" + names[j]];
            Assert.True(Math.Abs(grad[j] - expected) <= Math.Max(tolerance, 1e-7) * (Math.Abs(expected) + 1), $"{names[j]}: {grad[j]:R} vs scipy {expected:R}");
        }
    }

    [Theory]
    [InlineData(ObservableKind.SurfaceBrightness)]
    [InlineData(ObservableKind.Joint)]
    public void GroupsAtEqualValuesGiveTheOnePopulationLikelihood(ObservableKind kind)
    {
        // Closed form: with both groups' parameters set to one population's values each object's density is that population's, so
        // ln L, and the gradient summed over the copies, equal the one-population fit's: the vectorised kernels' gather of per-group
        // coefficients and per-group partial sums (two groups, catalogue weights 0.5–1.5, joint with κ and free Ωm) against the
        // single-cell path the scipy reference checks above.
        var obs = Mock();
        var w = obs.Z.Select((_, i) => 0.5 + i % 3 * 0.5).ToArray();
        obs = obs.WithSurvey(obs.Survey with { Group = obs.Z.Select((_, i) => i % 2 == 0 ? "early" : "late").ToArray(), Weight = w });
        var one = new SurveyModel(MarginaliseRedshift: true, RedshiftPriorMin: 0.3, RedshiftPriorMax: 2, ZMarginal: RedshiftMarginal.Linear);
        var many = one with { Groups = ["early", "late"] };
        var overrides = kind == ObservableKind.Joint ? new ParameterOverrides(Free: new HashSet<string> { "omega_m" }) : null;
        var h1 = Hypothesis.Create(WorldModels.LambdaCdm, new NuisanceModel(kind, SizeSbRelation: kind == ObservableKind.Joint, Survey: one), overrides);
        var h2 = Hypothesis.Create(WorldModels.LambdaCdm, new NuisanceModel(kind, SizeSbRelation: kind == ObservableKind.Joint, Survey: many), overrides);
        var l1 = h1.Bind(obs);
        var l2 = h2.Bind(obs);
        string Base(string name) => name.Split('@')[0];
        var t1 = h1.FreeParameters.Select(p => Values[p.Name]).ToArray();
        var t2 = h2.FreeParameters.Select(p => Values[Base(p.Name)]).ToArray();
        var g1 = new double[t1.Length];
        var g2 = new double[t2.Length];
        double v1 = l1.LogDensityAndGradient(t1, g1), v2 = l2.LogDensityAndGradient(t2, g2);
        Assert.True(double.IsFinite(v1));
        Assert.Equal(v1, v2, 9);
        for (int j = 0; j < t1.Length; j++)
        {
            string name = h1.FreeParameters[j].Name;
            double sum = h2.FreeParameters.Select((p, k) => (p, k)).Where(x => Base(x.p.Name) == name).Sum(x => g2[x.k]);
            Assert.True(Math.Abs(sum - g1[j]) <= 1e-9 * (Math.Abs(g1[j]) + 1), $"{name}: {sum:R} vs {g1[j]:R}");
        }
    }
}

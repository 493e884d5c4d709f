using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Inference.Survey;
using SizeTest.Simulation;
using Xunit;
using static SizeTest.Tests.Inference.Survey.SurveyFitting;

namespace SizeTest.Tests.Inference.Survey;

/// <summary>
/// The surface-brightness photo-z quadrature without a cut on the block-vectorised <see cref="RedshiftQuadratureKernel"/> (bound without
/// distances by <see cref="SurveyJointLikelihood"/>) against stored values of the per-object implementation it replaced there
/// (SurveyJointLikelihood.Accumulate at f01849e: one object at a time, log-sum-exp over its nodes, partials added to the free parameters
/// per node). The kernel sums the same terms in another order (per block, cell and group; vector exponentials, no shift), so agreement to
/// 10⁻¹² relative (ln L) and 10⁻¹² (|g| + 1) (gradient) shows it computes the same likelihood.
/// </summary>
/// <remarks>Cases: two groups with catalogue weights, ΛCDM (Ωm does not enter sb); a static model with its free dimming exponent,
/// binned evolution (μ0 per bin, no b) and a prior narrower than the data (dropped nodes); the static model with its free luminosity
/// exponent (the dimming's derivative through n = 2·luminosity_exponent). Each likelihood is also summed over two row slices split at an odd row, which must equal the whole.
/// Set SIZETEST_PRINT_SBQ=1 to print the values (how they were recorded).</remarks>
public sealed class SbRedshiftQuadratureTests(Xunit.Abstractions.ITestOutputHelper output)
{
    private static HypothesisLikelihood Bind(string kind)
    {
        var pops = new[] { new MockSubpopulation("early", 0.5, 3, -1.5, 0.2, 0.15), new MockSubpopulation("late", 0.5, 6, -0.75, 0.3, 0.2) };
        var lf = new SchechterLuminosityFunction();
        var pz = new MeasurementErrors(0.05, MuErrorMag: 0.1, PhotoZError: 0.08);
        var (mock, family, free) = kind switch
        {
            "groups" => (Draw(Lcdm, 300, 8, "uniform:0.3:2", errors: pz, survey: new SurveyPopulation(lf, Populations: pops)), WorldModels.LambdaCdm, ""),
            "binned" => (Draw(Lcdm, 300, 7, "uniform:0.3:2", errors: pz), WorldModels.Get("static-linear"), "dimming_exponent"),
            _ => (Draw(Lcdm, 300, 10, "uniform:0.3:2", errors: pz), WorldModels.Get("static-linear"), "luminosity_exponent"),
        };
        var obs = mock.ToObservables();
        var sv = kind switch
        {
            "groups" => new SurveyModel(Groups: ["early", "late"], MarginaliseRedshift: true),
            "binned" => new SurveyModel(EvolutionBinEdges: SurveyModel.EqualCountEdges(obs.Z, 3), MarginaliseRedshift: true, RedshiftPriorMin: 0.5, RedshiftPriorMax: 1.8),
            _ => new SurveyModel(MarginaliseRedshift: true),
        };
        if (kind == "groups")
        {
            // Catalogue weights 0.5 … 1.5 (a fixed pattern).
            var w = new double[obs.Count];
            for (int i = 0; i < w.Length; i++) w[i] = 0.5 + (i * 7 % 11) / 10.0;
            obs = obs.WithSurvey(obs.Survey with { Weight = w });
        }
        var overrides = new ParameterOverrides(Free: free.Length == 0 ? null : new HashSet<string> { free });
        return Hypothesis.Create(family, new NuisanceModel(ObservableKind.SurfaceBrightness, Survey: sv), overrides).Bind(obs);
    }

    // ln L, then the gradient, at the suggested start moved by +3% (at least 0.02) in every free parameter.
    private static readonly Dictionary<string, double[]> Stored = new()
    {
        ["groups"] = [-1443.4554965560515, -222.8448824161944, 162.09123007423622, 1966.3319608619104, -394.435793317423, 267.01417802454887, 1882.2597596493572],
        ["binned"] = [-821.7893007169283, -1301.0699806354392, -631.8598009632958, -570.8051109166914, -565.588445183469, 3914.1257430811434],
        ["static"] = [-1067.7800064273308, -1945.8019685019071, -1800.8799494554871, 972.900984249979, 5070.850234317071],
    };

    [Theory]
    [InlineData("groups")]
    [InlineData("binned")]
    [InlineData("static")]
    public void LogLikelihoodAndGradientEqualThePerObjectImplementation(string kind)
    {
        var lik = Bind(kind);
        output.WriteLine(string.Join(", ", lik.Hypothesis.FreeParameters.Select(p => p.Name)));
        StoredLikelihoodCheck.AssertMatchesStored(lik, kind, Stored, "SIZETEST_PRINT_SBQ", output);
    }
}

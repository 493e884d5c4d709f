using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Inference.Survey;
using SizeTest.Simulation;
using Xunit;
using static SizeTest.Tests.Inference.Survey.SurveyFitting;

namespace SizeTest.Tests.Inference.Survey;

/// <summary>
/// The linearised photo-z marginal's block-vectorised kernel (<see cref="LinearisedRedshiftKernel"/>) against stored values of the
/// per-object implementation it replaced (SurveySizeLikelihood.Accumulate at 188f94e: one object at a time, σ_eff = √(σ² + m′² s²),
/// partials added to the free parameters per object). The kernel sums the same terms in another order (per block, cell and group;
/// vector logarithms), so agreement to 10⁻¹² relative (ln L) and 10⁻¹² (|g| + 1) (gradient) shows it computes the same likelihood.
/// </summary>
/// <remarks>Cases: two groups with a size–luminosity relation, catalogue weights and a luminosity window (weights 0), fixed cosmology;
/// free Ωm with binned evolution and a prior narrower than the data (truncated moments, grid slope); the same groups with free Ωm (the
/// node adjoint of the mean and the slope); radio flux densities (C moving with z̄); a static model with its free luminosity exponent.
/// Each likelihood is also summed over two row slices split at an odd row, which must equal the whole. Set SIZETEST_PRINT_LINEAR=1 to
/// print the values (how they were recorded).</remarks>
public sealed class LinearisedRedshiftKernelTests(Xunit.Abstractions.ITestOutputHelper output)
{
    private static HypothesisLikelihood Bind(string kind)
    {
        var pops = new[] { new MockSubpopulation("early", 0.5, 3, -1.5, 0.2, 0.15), new MockSubpopulation("late", 0.5, 6, -0.75, 0.3, 0.2) };
        var lf = new SchechterLuminosityFunction();
        var pz = new MeasurementErrors(0.05, MuErrorMag: 0, PhotoZError: 0.08, SizeErrorFractionAtZMax: 0.2);
        var lin = RedshiftMarginal.Linear;
        var (mock, sv, family, free) = kind switch
        {
            "groups" or "groups-free" => (Draw(Lcdm, 300, 8, "uniform:0.3:2", errors: pz, survey: new SurveyPopulation(lf, Populations: pops)),
                new SurveyModel(SizeRelationKind.Luminosity, Groups: ["early", "late"], MarginaliseRedshift: true, ZMarginal: lin, AbsMagMin: -22.5, AbsMagMax: -18),
                WorldModels.LambdaCdm, kind == "groups" ? "" : "omega_m"),
            "binned" => (Draw(Lcdm, 300, 7, "uniform:0.3:2", errors: pz), null!, WorldModels.LambdaCdm, "omega_m"),
            "radio" => (Draw(Lcdm, 300, 9, "uniform:0.4:2.5", errors: pz, kind: MockObjectKind.CompactRadio, radio: new RadioSourcePopulation(LuminosityExponent: 0.1)),
                new SurveyModel(SizeRelationKind.Luminosity, MarginaliseRedshift: true, ZMarginal: lin), WorldModels.LambdaCdm, "omega_m"),
            _ => (Draw(Lcdm, 300, 10, "uniform:0.3:2", errors: pz, survey: new SurveyPopulation(lf, SizeLuminositySlope: 0.3)),
                new SurveyModel(SizeRelationKind.Luminosity, MarginaliseRedshift: true, ZMarginal: lin), WorldModels.Get("static-linear"), "luminosity_exponent"),
        };
        var obs = mock.ToObservables();
        if (kind == "binned")
            sv = new SurveyModel(EvolutionBinEdges: SurveyModel.EqualCountEdges(obs.Z, 3), MarginaliseRedshift: true, RedshiftPriorMin: 0.5, RedshiftPriorMax: 1.8, ZMarginal: lin);
        if (kind.StartsWith("groups", StringComparison.Ordinal))
        {
            // Catalogue weights 0.5 … 1.5 (a fixed pattern), on top of the window's zeros.
            var w = new double[obs.Count];
            for (int i = 0; i < w.Length; i++) w[i] = 0.5 + (i * 7 % 11) / 10.0;
            obs = obs.WithSurvey(obs.Survey with { Weight = w });
        }
        var overrides = new ParameterOverrides(Free: free.Length == 0 ? null : new HashSet<string> { free });
        return Hypothesis.Create(family, new NuisanceModel(ObservableKind.Size, Survey: sv), overrides).Bind(obs);
    }

    // ln L, then the gradient, at the suggested start moved by +3% (at least 0.02) in every free parameter.
    private static readonly Dictionary<string, double[]> Stored = new()
    {
        ["groups"] = [-113.39623134504973, -2.5880789786779173, -20.62376464926711, 6.72784824882187, 55.98393483401929, 10.88416936754487, -0.6250504148490519, 109.7437228766958, 15.733882425685387],
        ["groups-free"] = [-113.71734457019558, -17.15203137808859, -6.499292868868558, -22.884911819646266, 9.176699542230226, 60.78443122007931, 9.56128591108385, -2.874024452665295, 110.07554986185835, 20.381172625364982],
        ["binned"] = [-223.69663715064908, -8.597890202466747, 13.216992168607291, -11.035968146078796, -2.158161885613247, -65.75833225517141],
        ["radio"] = [-753.7295589772965, -753.623339890877, -38489.12035508515, -1016.2038821270038, 4392.232061340752, 243.40077534454824],
        ["static"] = [-304.70626504932085, 1.260210959009262, 6.613943870136691, 31.50527397523159, 458.9334890046676, 501.9607873373026],
    };

    [Theory]
    [InlineData("groups")]
    [InlineData("groups-free")]
    [InlineData("binned")]
    [InlineData("radio")]
    [InlineData("static")]
    public void LogLikelihoodAndGradientEqualThePerObjectImplementation(string kind)
    {
        var lik = Bind(kind);
        Assert.Contains(lik.SurveyNotes, n => n.Contains("linearised marginal", StringComparison.Ordinal));
        foreach (var note in lik.SurveyNotes.Where(n => n.StartsWith("luminosity window", StringComparison.Ordinal))) output.WriteLine(note);
        StoredLikelihoodCheck.AssertMatchesStored(lik, kind, Stored, "SIZETEST_PRINT_LINEAR", output);
    }
}

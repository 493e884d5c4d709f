using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Inference.Survey;
using SizeTest.Simulation;
using Xunit;
using static SizeTest.Tests.Inference.Survey.SurveyFitting;

namespace SizeTest.Tests.Inference.Survey;

/// <summary>
/// The analytic gradient of the survey terms against Richardson-extrapolated central finite differences of ln L, as in
/// GradientTests (Press et al. 2007 §5.7): size–luminosity relation, groups, binned evolution, photometric redshifts,
/// Gaussian size errors, radio flux densities, free Ωm, a static model's free luminosity exponent, and the --min-size
/// truncation with the relation, with Gaussian errors and inside the photo-z integral; and the same for the surface-brightness and
/// joint survey kernel (Survey.SurveyJointLikelihood): photometric redshifts (with an SB or magnitude limit inside the integral),
/// groups, binned evolution, the size–luminosity and size–SB relations, free Ωm, a static model's free dimming and luminosity exponents;
/// and the linearised photo-z marginal of the size kernel (RedshiftMarginal.Linear: m′ through a, β, e and the grid nodes' slope
/// stencil) alone, with radio luminosities, a static model, the truncation and Gaussian errors, and of the sb and joint kernel (C + s² g gᵀ,
/// g through a, b, β, γ, κ, e, the dimming and the slope stencil; with an SB or magnitude limit, groups, binned evolution).
/// Tolerance: |analytic − FD| ≤ 10⁻⁵ (|FD| + 1), and 10⁻⁴ for Gaussian size errors, whose analytic derivative is that of the
/// exact integral (posterior expectations) while FD differentiates the 20-node adaptive quadrature, whose nodes move with the
/// parameters (measured difference 2·10⁻⁵ relative).
/// </summary>
public sealed class SurveyGradientTests
{
    private static readonly IWorldModel Lcdm = new LambdaCdmModel(70, 0.3);

    public static TheoryData<string, string> Cases() => new()
    {
        { "luminosity", "" }, { "luminosity", "omega_m" }, { "groups", "omega_m" }, { "binned", "" }, { "photoz", "" },
        { "photoz", "omega_m" }, { "gaussian", "" }, { "radio", "omega_m" }, { "static", "luminosity_exponent" },
        { "minsize", "omega_m" }, { "minsize-gaussian", "" }, { "minsize-photoz", "omega_m" },
        { "linear", "" }, { "linear", "omega_m" }, { "linear-radio", "omega_m" }, { "linear-static", "luminosity_exponent" },
        { "linear-minsize", "omega_m" }, { "linear-gaussian", "omega_m" },
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void AnalyticGradientMatchesFiniteDifferences(string kind, string free)
    {
        var pops = new[] { new MockSubpopulation("early", 0.5, 3, -1.5, 0.2, 0.15), new MockSubpopulation("late", 0.5, 6, -0.75, 0.3, 0.2) };
        var lf = new SchechterLuminosityFunction();
        var cut = kind.Contains("minsize", StringComparison.Ordinal) ? new MockSelection(MinThetaArcsec: 0.4) : null;
        var mock = kind switch
        {
            "minsize" => Draw(Lcdm, 300, 1, selection: cut, survey: new SurveyPopulation(lf, SizeLuminositySlope: 0.3)),
            "minsize-gaussian" => Draw(Lcdm, 300, 1, "uniform:0.1:2", errors: new MeasurementErrors(0.1, SizeErrors: SizeErrorModel.Gaussian, SizeErrorFractionAtZMax: 0.3), selection: cut),
            "minsize-photoz" => Draw(Lcdm, 300, 1, "uniform:0.3:2", errors: new MeasurementErrors(0.05, PhotoZError: 0.05), selection: cut),
            "radio" => Draw(Lcdm, 300, 1, "uniform:0.4:2.5", kind: MockObjectKind.CompactRadio, radio: new RadioSourcePopulation(LuminosityExponent: 0.1)),
            "photoz" or "linear" => Draw(Lcdm, 300, 1, "uniform:0.3:2", errors: new MeasurementErrors(0.05, PhotoZError: 0.05)),
            "linear-radio" => Draw(Lcdm, 300, 1, "uniform:0.4:2.5", errors: new MeasurementErrors(0.05, PhotoZError: 0.05), kind: MockObjectKind.CompactRadio, radio: new RadioSourcePopulation(LuminosityExponent: 0.1)),
            "linear-static" => Draw(Lcdm, 300, 1, "uniform:0.3:2", errors: new MeasurementErrors(0.05, PhotoZError: 0.05), survey: new SurveyPopulation(lf, SizeLuminositySlope: 0.3)),
            "linear-minsize" => Draw(Lcdm, 300, 1, "uniform:0.3:2", errors: new MeasurementErrors(0.05, PhotoZError: 0.05), selection: new MockSelection(MinThetaArcsec: 0.4)),
            "linear-gaussian" => Draw(Lcdm, 300, 1, "uniform:0.3:2", errors: new MeasurementErrors(0.1, PhotoZError: 0.05, SizeErrors: SizeErrorModel.Gaussian, SizeErrorFractionAtZMax: 0.3)),
            "gaussian" => Draw(Lcdm, 300, 1, "uniform:0.1:2", errors: new MeasurementErrors(0.1, SizeErrors: SizeErrorModel.Gaussian, SizeErrorFractionAtZMax: 0.4)),
            "groups" => Draw(Lcdm, 300, 1, survey: new SurveyPopulation(lf, Populations: pops)),
            _ => Draw(Lcdm, 300, 1, survey: new SurveyPopulation(lf, SizeLuminositySlope: 0.3)),
        };
        var obs = mock.ToObservables();
        var sv = kind switch
        {
            "groups" => new SurveyModel(SizeRelationKind.Luminosity, Groups: ["early", "late"]),
            "binned" => new SurveyModel(EvolutionBinEdges: SurveyModel.EqualCountEdges(obs.Z, 3)),
            "photoz" => new SurveyModel(MarginaliseRedshift: true),
            "gaussian" or "minsize-gaussian" => new SurveyModel(SizeErrors: SizeErrorKind.Gaussian),
            "minsize-photoz" => new SurveyModel(MarginaliseRedshift: true),
            "linear" or "linear-minsize" => new SurveyModel(MarginaliseRedshift: true, ZMarginal: RedshiftMarginal.Linear),
            "linear-radio" or "linear-static" => new SurveyModel(SizeRelationKind.Luminosity, MarginaliseRedshift: true, ZMarginal: RedshiftMarginal.Linear),
            "linear-gaussian" => new SurveyModel(MarginaliseRedshift: true, SizeErrors: SizeErrorKind.Gaussian, ZMarginal: RedshiftMarginal.Linear),
            _ => new SurveyModel(SizeRelationKind.Luminosity),
        };
        var family = kind is "static" or "linear-static" ? WorldModels.Get("static-linear") : WorldModels.LambdaCdm;
        var overrides = new ParameterOverrides(Free: free.Length == 0 ? null : new HashSet<string> { free });
        var lik = Hypothesis.Create(family, new NuisanceModel(ObservableKind.Size, cut is null ? null : new SelectionLimits(MinThetaArcsec: 0.4), Survey: sv), overrides).Bind(obs);
        AssertGradientMatches(lik, kind.EndsWith("gaussian", StringComparison.Ordinal) ? 1e-4 : 1e-5, $"{kind}/{free}");
    }

    public static TheoryData<string, string, string> SurfaceBrightnessCases() => new()
    {
        { "sb", "photoz", "" }, { "sb", "photoz-sblimit", "" }, { "sb", "groups", "" }, { "sb", "binned", "" }, { "sb", "photoz-static", "dimming_exponent" },
        { "joint", "photoz", "omega_m" }, { "joint", "photoz-maglimit", "omega_m" }, { "joint", "groups", "omega_m" }, { "joint", "binned", "" },
        { "joint", "luminosity", "omega_m" }, { "joint", "photoz-luminosity", "omega_m" }, { "joint", "kormendy-photoz", "omega_m" },
        { "joint", "static-luminosity", "luminosity_exponent" }, { "joint", "photoz", "" },
        // The magnitude limit with the size–luminosity relation selects on the conditioning magnitudes: no truncation, γ (sb_luminosity_slope) free.
        { "joint", "photoz-luminosity-maglimit", "omega_m" }, { "joint", "kormendy-luminosity", "omega_m" },
        // The linearised photo-z marginal (RedshiftMarginal.Linear): covariance C + s² g gᵀ, g through a, b, β, γ, κ, e, the dimming and D_A's
        // slope stencil; the truncation taken with the effective covariance.
        { "sb", "photoz-linear", "" }, { "sb", "photoz-sblimit-linear", "" }, { "sb", "photoz-static-linear", "dimming_exponent" },
        { "sb", "photoz-groups-linear", "" },
        { "joint", "photoz-linear", "omega_m" }, { "joint", "photoz-linear", "" }, { "joint", "photoz-maglimit-linear", "omega_m" },
        { "joint", "photoz-luminosity-linear", "omega_m" }, { "joint", "kormendy-photoz-linear", "omega_m" },
        { "joint", "photoz-static-luminosity-linear", "luminosity_exponent" }, { "joint", "photoz-binned-linear", "omega_m" },
        { "joint", "photoz-sblimit-kormendy-linear", "" }, { "joint", "photoz-groups-linear", "omega_m" },
    };

    [Theory]
    [MemberData(nameof(SurfaceBrightnessCases))]
    public void AnalyticGradientOfTheSbAndJointSurveyKernelMatchesFiniteDifferences(string observable, string kind, string free)
    {
        bool linear = kind.EndsWith("-linear", StringComparison.Ordinal);
        string label = kind;
        if (linear) kind = kind[..^"-linear".Length];
        var pops = new[] { new MockSubpopulation("early", 0.5, 3, -1.5, 0.2, 0.15), new MockSubpopulation("late", 0.5, 6, -0.75, 0.3, 0.2) };
        var lf = new SchechterLuminosityFunction();
        bool photoz = kind.Contains("photoz", StringComparison.Ordinal);
        var cut = kind.Contains("sblimit", StringComparison.Ordinal) ? new MockSelection(SbLimit: 24)
            : kind.EndsWith("maglimit", StringComparison.Ordinal) ? new MockSelection(MagLimit: 24) : null;
        var errors = new MeasurementErrors(0.05, MuErrorMag: 0.1, PhotoZError: photoz ? 0.05 : 0);
        var mock = kind switch
        {
            _ when kind.Contains("groups", StringComparison.Ordinal) => Draw(Lcdm, 300, 2, "uniform:0.3:2", errors: errors, survey: new SurveyPopulation(lf, Populations: pops)),
            _ when kind.Contains("luminosity", StringComparison.Ordinal) => Draw(Lcdm, 300, 2, "uniform:0.3:2", errors: errors, survey: new SurveyPopulation(lf, SizeLuminositySlope: 0.3)),
            _ => Draw(Lcdm, 300, 2, "uniform:0.3:2", errors: errors, selection: cut),
        };
        var obs = mock.ToObservables();
        var sv = new SurveyModel(
            kind.Contains("luminosity", StringComparison.Ordinal) ? SizeRelationKind.Luminosity : SizeRelationKind.None,
            Groups: kind.Contains("groups", StringComparison.Ordinal) ? ["early", "late"] : null,
            EvolutionBinEdges: kind.Contains("binned", StringComparison.Ordinal) ? SurveyModel.EqualCountEdges(obs.Z, 3) : null,
            MarginaliseRedshift: photoz, ZMarginal: linear ? RedshiftMarginal.Linear : RedshiftMarginal.Quadrature);
        var family = kind.Contains("static", StringComparison.Ordinal) ? WorldModels.Get("static-linear") : WorldModels.LambdaCdm;
        var limits = cut is null ? null : new SelectionLimits(cut.SbLimit, cut.MagLimit);
        var kindOfFit = observable == "sb" ? ObservableKind.SurfaceBrightness : ObservableKind.Joint;
        var nuisance = new NuisanceModel(kindOfFit, limits, SizeSbRelation: kind.Contains("kormendy", StringComparison.Ordinal), Survey: sv);
        var overrides = new ParameterOverrides(Free: free.Length == 0 ? null : new HashSet<string> { free });
        var lik = Hypothesis.Create(family, nuisance, overrides).Bind(obs);
        Assert.True(lik.HasSurveyTerms);
        if (linear) Assert.Contains(lik.SurveyNotes, n => n.Contains("linearised marginal", StringComparison.Ordinal));
        AssertGradientMatches(lik, 1e-5, $"{observable}/{label}/{free}");
    }
}

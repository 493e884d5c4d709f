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
/// truncation with the relation, with Gaussian errors and inside the photo-z integral.
/// Tolerance: |analytic − FD| ≤ 10⁻⁵ (|FD| + 1), and 10⁻⁴ for Gaussian size errors, whose analytic derivative is that of the
/// exact integral (posterior expectations) while FD differentiates the 20-node adaptive quadrature, whose nodes move with the
/// parameters (measured difference 2·10⁻⁵ relative).
/// </summary>
public sealed class SurveyGradientTests
{
    private static readonly IWorldModel Lcdm = new LambdaCdmModel(70, 0.3);

    private static double[] FiniteDifference(ILogDensity f, double[] theta)
    {
        var g = new double[theta.Length];
        for (int j = 0; j < theta.Length; j++)
        {
            double h = 1e-3 * Math.Max(Math.Abs(theta[j]), 0.05);
            double D(double step)
            {
                var p = (double[])theta.Clone(); p[j] += step;
                var m = (double[])theta.Clone(); m[j] -= step;
                return (f.LogDensity(p) - f.LogDensity(m)) / (2 * step);
            }
            g[j] = (4 * D(h / 2) - D(h)) / 3;
        }
        return g;
    }

    public static TheoryData<string, string> Cases() => new()
    {
        { "luminosity", "" }, { "luminosity", "omega_m" }, { "groups", "omega_m" }, { "binned", "" }, { "photoz", "" },
        { "photoz", "omega_m" }, { "gaussian", "" }, { "radio", "omega_m" }, { "static", "luminosity_exponent" },
        { "minsize", "omega_m" }, { "minsize-gaussian", "" }, { "minsize-photoz", "omega_m" },
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void AnalyticGradientMatchesFiniteDifferences(string kind, string free)
    {
        var pops = new[] { new MockSubpopulation("early", 0.5, 3, -1.5, 0.2, 0.15), new MockSubpopulation("late", 0.5, 6, -0.75, 0.3, 0.2) };
        var lf = new SchechterLuminosityFunction();
        var cut = kind.StartsWith("minsize", StringComparison.Ordinal) ? new MockSelection(MinThetaArcsec: 0.4) : null;
        var mock = kind switch
        {
            "minsize" => Draw(Lcdm, 300, 1, selection: cut, survey: new SurveyPopulation(lf, SizeLuminositySlope: 0.3)),
            "minsize-gaussian" => Draw(Lcdm, 300, 1, "uniform:0.1:2", errors: new MeasurementErrors(0.1, SizeErrors: SizeErrorModel.Gaussian, SizeErrorFractionAtZMax: 0.3), selection: cut),
            "minsize-photoz" => Draw(Lcdm, 300, 1, "uniform:0.3:2", errors: new MeasurementErrors(0.05, PhotoZError: 0.05), selection: cut),
            "radio" => Draw(Lcdm, 300, 1, "uniform:0.4:2.5", kind: MockObjectKind.CompactRadio, radio: new RadioSourcePopulation(LuminosityExponent: 0.1)),
            "photoz" => Draw(Lcdm, 300, 1, "uniform:0.3:2", errors: new MeasurementErrors(0.05, PhotoZError: 0.05)),
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
            _ => new SurveyModel(SizeRelationKind.Luminosity),
        };
        var family = kind == "static" ? WorldModels.Get("static-linear") : WorldModels.LambdaCdm;
        var overrides = new ParameterOverrides(Free: free.Length == 0 ? null : new HashSet<string> { free });
        var lik = Hypothesis.Create(family, new NuisanceModel(ObservableKind.Size, cut is null ? null : new SelectionLimits(MinThetaArcsec: 0.4), Survey: sv), overrides).Bind(obs);
        var t = SizeTest.Tests.Inference.GradientTests.OffMaximum(lik);
        var fp = lik.Hypothesis.FreeParameters;
        var analytic = new double[t.Length];
        double v = lik.LogDensityAndGradient(t, analytic);
        Assert.True(double.IsFinite(v));
        Assert.Equal(lik.LogDensity(t), v, 9);
        var fd = FiniteDifference(lik, t);
        for (int j = 0; j < t.Length; j++)
            Assert.True(Math.Abs(analytic[j] - fd[j]) <= (kind.EndsWith("gaussian", StringComparison.Ordinal) ? 1e-4 : 1e-5) * (Math.Abs(fd[j]) + 1),
                $"{kind}/{free}: {fp[j].Name}: analytic {analytic[j]:R}, finite difference {fd[j]:R}");
    }
}

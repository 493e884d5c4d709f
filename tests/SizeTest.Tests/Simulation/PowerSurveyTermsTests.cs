using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Simulation;
using Xunit;
using Xunit.Abstractions;

namespace SizeTest.Tests.Simulation;

/// <summary>
/// A power analysis of a survey design fits its mocks with the survey terms fit would take for such a catalogue
/// (<see cref="PowerCandidates.Survey"/>): the size–luminosity relation for a magnitude-limited sample drawn from a luminosity
/// function, one set of nuisance parameters per population, photometric-redshift marginalisation.
/// </summary>
public sealed class PowerSurveyTermsTests(ITestOutputHelper output)
{
    private static readonly IWorldModel Lcdm = WorldModels.Get("lcdm").Create(new Dictionary<string, double>());

    private static MockSurveySpec MagnitudeLimited(int n) => new(Lcdm,
        new SurveyDesign(n, RedshiftDistribution.Uniform(0.2, 2), Selection: new MockSelection(MagLimit: 24)), 3, null, null,
        new SurveyPopulation(new SchechterLuminosityFunction(), SizeLuminositySlope: 0.3));

    private static PowerResult Run(MockSurveySpec spec, ObservableKind kind, bool surveyTerms, int mocks)
    {
        var nuisance = PowerCandidates.Nuisance(spec, kind);
        var survey = PowerCandidates.Survey(spec, kind);
        if (!surveyTerms) nuisance = nuisance with { Survey = null };
        var candidates = PowerCandidates.Create(spec.Model, [WorldModels.Get("lcdm"), WorldModels.Get("static-linear")], nuisance,
            new Dictionary<string, double>(), new HashSet<string>());
        return PowerAnalysis.Run(new PowerRequest(spec, candidates, "lcdm", mocks, [spec.Design.Count]) { Survey = surveyTerms ? survey : null });
    }

    [Fact]
    public void AMagnitudeLimitedDesignIsInterpretableOnlyWithTheRelation()
    {
        // Without the relation the joint fit cannot describe these mocks (a biased by ≈ −0.9, about ten spreads, measured at N = 1000):
        // no power may be claimed. With it every parameter is recovered (|bias| < 2 spreads, coverage ≥ 40%: PowerAnalysis.RecoveryFailures),
        // the slopes against their implied truths γ = 1 − 2β = 0.4 and b = −2a = 2 (PhotometricSurfaceBrightness).
        var spec = MagnitudeLimited(600);
        var without = Run(spec, ObservableKind.Joint, surveyTerms: false, mocks: 10);
        Assert.Equal(PowerAnalysis.NotInterpretable, without.Points.Single().Verdict);
        var with = Run(spec, ObservableKind.Joint, surveyTerms: true, mocks: 24);
        var point = with.Points.Single();
        foreach (var r in point.Recovery) output.WriteLine($"{r.Name}: truth {r.Truth:G4}, bias {r.Bias:+0.000;-0.000}, spread {r.Spread:0.000}, coverage {r.Coverage:P0}");
        Assert.Empty(point.RecoveryFailures);
        Assert.NotEqual(PowerAnalysis.NotInterpretable, point.Verdict);
        var names = point.Recovery.Select(r => r.Name).ToHashSet();
        foreach (var name in new[] { "size_luminosity_slope", "sb_luminosity_slope", "sb_evolution", "mu0", "scatter_mag" }) Assert.Contains(name, names);
        Assert.Equal(0.4, point.Recovery.Single(r => r.Name == "sb_luminosity_slope").Truth, 12);
        Assert.Equal(2.0, point.Recovery.Single(r => r.Name == "sb_evolution").Truth, 12);
        Assert.Contains(with.Notes, n => n.Contains("size–luminosity relation", StringComparison.Ordinal));
    }

    [Fact]
    public void PopulationsAndPhotometricRedshiftsAreFittedAsFitWouldFitThem()
    {
        // Two populations with their own a, σ_z = 0.05 (1+z): each group's a is a truth of its own and is recovered; the note that
        // photo-z errors are "not modelled" is gone.
        var spec = new MockSurveySpec(Lcdm,
            new SurveyDesign(800, RedshiftDistribution.Uniform(0.2, 2.5), MockObjectKind.Galaxy, new MeasurementErrors(0.05, PhotoZError: 0.05), null), 4, null, null,
            new SurveyPopulation(Populations: [new MockSubpopulation("early", 0.5, 3, -1.5, 0, 0.2), new MockSubpopulation("late", 0.5, 6, -0.75, 0, 0.2)]));
        var r = Run(spec, ObservableKind.Size, surveyTerms: true, mocks: 8);
        var point = r.Points.Single();
        foreach (var x in point.Recovery) output.WriteLine($"{x.Name}: truth {x.Truth:G4}, bias {x.Bias:+0.000;-0.000}, spread {x.Spread:0.000}, coverage {x.Coverage:P0}");
        Assert.Equal(-1.5, point.Recovery.Single(x => x.Name == "size_evolution@early").Truth);
        Assert.Equal(-0.75, point.Recovery.Single(x => x.Name == "size_evolution@late").Truth);
        Assert.Empty(point.RecoveryFailures);
        Assert.DoesNotContain(r.Notes, n => n.Contains("not modelled by the fit", StringComparison.Ordinal));
        Assert.Contains(r.Notes, n => n.Contains("photometric redshift", StringComparison.Ordinal));
    }
}

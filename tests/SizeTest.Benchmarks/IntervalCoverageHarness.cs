using System.Diagnostics;
using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Simulation;

namespace SizeTest.Benchmarks;

/// <summary>
/// The full-size interval-coverage study of issue 11 (the unit test <c>IntervalCoverageTests</c> runs a reduced count):
/// <c>dotnet run -c Release --project tests/SizeTest.Benchmarks -- --interval-coverage [MOCKS] [FIRST] [--details]</c>
/// (<c>--details</c> prints every mock's estimates).
/// Mocks of 2000 galaxies, flat ΛCDM with Ωm = 0.3, z uniform in [0.1, 3], the default galaxy population
/// (R0 = 5 kpc, a = −1, 0.2 dex) and errors; fitted by lcdm with omega_m free (sizes). Prints the coverage of each
/// parameter's reported 68% interval and of the plain Hessian interval. FIRST offsets the mock index, so a long run can be
/// split into pieces whose counts add up.
/// </summary>
public static class IntervalCoverageHarness
{
    /// <summary>The study seed (shared with the unit test).</summary>
    public const long Seed = 20261202;

    /// <summary>Runs it.</summary>
    public static void Run(string[] args, TextWriter o)
    {
        int mocks = args.Length > 0 ? int.Parse(args[0], System.Globalization.CultureInfo.InvariantCulture) : 200;
        int first = args.Length > 1 ? int.Parse(args[1], System.Globalization.CultureInfo.InvariantCulture) : 0;
        bool details = args.Contains("--details");
        var (template, hypothesis, truth) = Setup();
        var sw = Stopwatch.StartNew();
        var r = IntervalCoverageStudy.Run(template, hypothesis, truth, mocks, Seed, first: first);
        o.WriteLine($"interval coverage: {r.Mocks} mocks (index {first}..{first + mocks - 1}) of 2000 galaxies, lcdm omega_m free; {r.Multimodal} multimodal; {sw.Elapsed.TotalSeconds:0.0} s");
        if (details) WriteDetails(r, first, o);
        foreach (var c in r.Parameters)
            o.WriteLine(FormattableString.Invariant($"  {c.Name,-15} truth {c.Truth,6:0.###}  reported {c.Covered,4}/{c.Mocks} = {c.Coverage:P1}  hull {c.HullCovered,4}/{c.Mocks} = {c.HullCoverage:P1}  plain Hessian {c.HessianCovered,4}/{c.Mocks} = {c.HessianCoverage:P1}  methods {string.Join(", ", c.ByMethod.Select(kv => $"{kv.Key} {kv.Value}"))}"));
    }

    private static void WriteDetails(IntervalCoverageResult r, int first, TextWriter o)
    {
        for (int k = 0; k < r.PerMock.Count; k++)
        {
            var (rep, hes, multi) = r.PerMock[k];
            o.WriteLine(FormattableString.Invariant($"  mock {first + k,4}{(multi ? " multimodal" : "")}: ")
                + string.Join("; ", rep.Where(e => !e.Fixed).Select((e, i) => FormattableString.Invariant(
                    $"{e.Name} {e.Value:G4} [{e.Lo:G4}, {e.Hi:G4}] {e.IntervalMethod}{(e.Regions.Count > 1 ? " pieces " + string.Join(" ", e.Regions.Select(q => $"[{q.Lo:G4},{q.Hi:G4}]")) : "")} hessian [{hes.First(h => h.Name == e.Name).Lo:G4}, {hes.First(h => h.Name == e.Name).Hi:G4}]"))));
        }
    }

    /// <summary>The design, hypothesis and truth of the study.</summary>
    public static (MockSurveySpec Template, Hypothesis Hypothesis, IReadOnlyDictionary<string, double> Truth) Setup()
    {
        var model = WorldModels.LambdaCdm.Create(new Dictionary<string, double> { ["omega_m"] = 0.3 });
        var template = new MockSurveySpec(model, new SurveyDesign(2000, RedshiftDistribution.Uniform(0.1, 3)), Seed);
        var h = Hypothesis.Create(WorldModels.LambdaCdm, new NuisanceModel(ObservableKind.Size), new ParameterOverrides(Free: new HashSet<string> { "omega_m" }));
        var truth = new Dictionary<string, double> { ["omega_m"] = 0.3, ["r0_kpc"] = 5.0, ["size_evolution"] = -1.0, ["scatter_dex"] = 0.2 };
        return (template, h, truth);
    }
}

using System.Diagnostics;
using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Inference.Survey;
using SizeTest.Photometry;
using SizeTest.Simulation;

namespace SizeTest.Benchmarks;

/// <summary>
/// Issue 12 target: photometric-redshift marginalisation costs ≤ 3× the spectroscopic fit.
/// <c>dotnet run -c Release --project tests/SizeTest.Benchmarks -- --photoz-cost [N] [REPEATS] [size|sb|joint]</c> (defaults 2000, 5,
/// size; sb and joint fit the same mocks' surface brightnesses too): draws one
/// ΛCDM mock of N galaxies, z_true uniform on [0.3, 2], σ_z = 0.08 (1+z), 5% log-normal size errors (the design of the photo-z
/// tests), and times the maximum-likelihood fit (Ωm free, Bind + MaximumLikelihood.Fit) three ways, the median of REPEATS
/// runs each after one warm-up: the same mock's catalogue with z taken as exact (--ignore-z-err), the same with z marginalised
/// over a flat prior on [0.3, 2], and a spectroscopic mock (σ_z = 0) of the same design. Prints wall time, likelihood
/// evaluations and time per evaluation of each, the ratios marginalised / spectroscopic, and the marginalised fit's cost
/// against its number of redshift nodes (3, 5, 7, 9).
/// </summary>
public static class PhotoZCost
{
    /// <summary>Runs it.</summary>
    public static void Run(string[] args, TextWriter o)
    {
        var inv = System.Globalization.CultureInfo.InvariantCulture;
        int n = args.Length > 0 ? int.Parse(args[0], inv) : 2000;
        int repeats = args.Length > 1 ? int.Parse(args[1], inv) : 5;
        if (n < 10 || repeats < 1) throw new ArgumentException("--photoz-cost N REPEATS: N ≥ 10, REPEATS ≥ 1");
        var observable = args.Length > 2 ? args[2] switch
        {
            "size" => ObservableKind.Size,
            "sb" => ObservableKind.SurfaceBrightness,
            "joint" => ObservableKind.Joint,
            _ => throw new ArgumentException("--photoz-cost N REPEATS OBSERVABLE: the observable is size, sb or joint"),
        } : ObservableKind.Size;
        var model = new LambdaCdmModel(70, 0.3);
        var photo = Draw(model, n, 31, 0.08).ToObservables();
        var spec = Draw(model, n, 31, 0.0).ToObservables();
        var marg = new SurveyModel(MarginaliseRedshift: true, RedshiftPriorMin: 0.3, RedshiftPriorMax: 2);

        var s = Time(spec, null, repeats, observable);
        var i = Time(photo, null, repeats, observable);
        var m = Time(photo, marg, repeats, observable);
        o.WriteLine(FormattableString.Invariant($"photo-z cost, N = {n}, median of {repeats} fits (ΛCDM, observable {observable}), {Environment.ProcessorCount} cores:"));
        Line(o, "spectroscopic mock (σ_z = 0)", s);
        Line(o, "photo-z mock, z taken as exact", i);
        Line(o, "photo-z mock, z marginalised", m);
        o.WriteLine(FormattableString.Invariant(
            $"ratio marginalised / spectroscopic: {m.Seconds / s.Seconds:0.00}x wall ({m.Seconds / i.Seconds:0.00}x against the same catalogue with z exact); per evaluation {m.PerEval / s.PerEval:0.00}x; target ≤ 3x"));
        // Where the cost goes: the time per evaluation against the number J of redshift nodes (the default is 7): the intercept
        // is the survey kernel's fixed cost per object, the slope the cost of one more node per object.
        foreach (int j in new[] { 3, 5, 7, 9 })
        {
            string what = FormattableString.Invariant($"  marginalised, {j} z nodes");
            try { Line(o, what, Time(photo, marg with { RedshiftNodes = j }, repeats, observable)); }
            catch (InvalidOperationException ex) { o.WriteLine($"  {what,-32} {ex.Message}"); }
        }
    }

    private static void Line(TextWriter o, string what, (double Seconds, int Evaluations, double PerEval) t) =>
        o.WriteLine(FormattableString.Invariant($"  {what,-32} {t.Seconds * 1e3,9:0.0} ms  {t.Evaluations,5} evaluations  {t.PerEval * 1e6,8:0.0} µs/evaluation"));

    private static MockCatalogue Draw(IWorldModel model, int n, long seed, double sigmaZ)
    {
        if (!RedshiftDistribution.TryParse("uniform:0.3:2", out var dist, out var err)) throw new InvalidOperationException(err);
        var design = new SurveyDesign(n, dist!, MockObjectKind.Galaxy, new MeasurementErrors(0.05, MuErrorMag: 0, PhotoZError: sigmaZ), null);
        return MockSurveyGenerator.Generate(new MockSurveySpec(model, design, seed, null, null, null), parallel: false);
    }

    private static (double Seconds, int Evaluations, double PerEval) Time(Observables obs, SurveyModel? survey, int repeats, ObservableKind observable)
    {
        var h = Hypothesis.Create(WorldModels.LambdaCdm, new NuisanceModel(observable, Survey: survey));
        var times = new double[repeats];
        int evals = 0;
        for (int r = -1; r < repeats; r++)
        {
            var sw = Stopwatch.StartNew();
            var fit = MaximumLikelihood.Fit(h.Bind(obs));
            sw.Stop();
            if (!fit.Converged) throw new InvalidOperationException("fit did not converge: " + fit.ExitReason.Text);
            evals = fit.Evaluations;
            if (r >= 0) times[r] = sw.Elapsed.TotalSeconds;
        }
        Array.Sort(times);
        double med = times[repeats / 2];
        return (med, evals, med / Math.Max(evals, 1));
    }
}

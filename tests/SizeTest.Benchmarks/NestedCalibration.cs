using System.Diagnostics;
using System.Globalization;
using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Inference.Sampling;
using SizeTest.Simulation;
using SizeTest.Tests.Inference.Sampling;

namespace SizeTest.Benchmarks;

/// <summary>
/// Full-size calibration of the nested sampler's ln Z and its quoted error σ (the unit test
/// <c>NestedEvidenceCalibrationTests</c> runs a reduced count):
/// <c>dotnet run -c Release --project tests/SizeTest.Benchmarks -- --nested-calibration [RUNS] [N,N,…] [PROBLEM,…|all|fit] [SLICES_PER_DIM]</c>
/// (SLICES_PER_DIM × d slice steps per replacement instead of the default).
/// For each closed-form problem of <c>EvidenceProblems</c> (tests/SizeTest.Tests, linked here) and each live-point
/// count N it runs RUNS seeds and prints the bias mean(ln Z − ln Z_exact) with its standard error, the seed-to-seed
/// scatter s.d.(ln Z), the mean quoted σ, their ratio, and the fractions of runs with |Δ| &lt; σ and &lt; 2σ.
/// <c>fit</c> runs the likelihood of a real size fit instead (a 500-galaxy mock, lcdm with Ωm, R0, a and the scatter
/// free), which has no closed form: it prints mean ln Z per N, so ln Z(N₁) − ln Z(N₂) is the bias difference.
/// </summary>
public static class NestedCalibration
{
    /// <summary>Runs it.</summary>
    public static void Run(string[] args, TextWriter o)
    {
        var inv = CultureInfo.InvariantCulture;
        int runs = args.Length > 0 ? int.Parse(args[0], inv) : 50;
        int[] lives = args.Length > 1 ? [.. args[1].Split(',').Select(s => int.Parse(s, inv))] : [100, 400, 1000];
        string which = args.Length > 2 ? args[2] : "all";
        int? slicesPerDim = args.Length > 3 ? int.Parse(args[3], inv) : null;
        var problems = which == "fit" ? [FitProblem()]
            : EvidenceProblems.All().Where(p => which == "all" || which.Split(',').Contains(p.Name)).ToList();
        o.WriteLine($"nested-sampling calibration: {runs} seeds per row; Δ = ln Z − exact; cover1 = |Δ| < σ, cover2 = |Δ| < 2σ");
        o.WriteLine("problem          N     exact     bias ± se      scatter  mean σ  scatter/σ  cover1  cover2   H     evals    s/run");
        foreach (var p in problems)
            foreach (int n in lives)
            {
                var results = new EvidenceResult[runs];
                var sw = Stopwatch.StartNew();
                Parallel.For(0, runs, new ParallelOptions { MaxDegreeOfParallelism = 2 }, k =>
                    results[k] = new NestedSampler(p.LogLikelihood, p.Priors, new NestedSamplerOptions { LivePoints = n, Seed = k + 1, SliceSteps = slicesPerDim * p.Priors.Length }).Run());
                double exact = double.IsNaN(p.ExactLogEvidence) ? 0 : p.ExactLogEvidence;
                var delta = results.Select(r => r.LogEvidence - exact).ToArray();
                double mean = delta.Average();
                double sd = Math.Sqrt(delta.Sum(x => (x - mean) * (x - mean)) / (runs - 1));
                double sigma = results.Average(r => r.LogEvidenceError);
                double c1 = results.Count(r => Math.Abs(r.LogEvidence - exact) < r.LogEvidenceError) / (double)runs;
                double c2 = results.Count(r => Math.Abs(r.LogEvidence - exact) < 2 * r.LogEvidenceError) / (double)runs;
                string cover = double.IsNaN(p.ExactLogEvidence) ? "     —       —  " : $"{c1,6:P0}  {c2,6:P0}";
                o.WriteLine(string.Create(inv,
                    $"{p.Name,-14} {n,5} {p.ExactLogEvidence,9:0.000} {mean,8:+0.000;-0.000} ± {sd / Math.Sqrt(runs),5:0.000}  {sd,7:0.000}  {sigma,6:0.000}  {sd / sigma,8:0.00}  {cover}  {results.Average(r => r.Information),5:0.0}  {results.Average(r => (double)r.Evaluations),8:0}  {sw.Elapsed.TotalSeconds / runs,6:0.00}"));
            }
    }

    /// <summary>
    /// The likelihood of a real fit: a 500-galaxy mock (seed 7) of flat ΛCDM Ωm = 0.3 with the default population,
    /// fitted by lcdm with omega_m free, so Ωm, R0, a and the scatter are sampled under the hypothesis' priors.
    /// ln Z is not known (ExactLogEvidence = NaN).
    /// </summary>
    private static EvidenceProblem FitProblem()
    {
        var model = WorldModels.LambdaCdm.Create(new Dictionary<string, double> { ["omega_m"] = 0.3 });
        var spec = new MockSurveySpec(model, new SurveyDesign(500, RedshiftDistribution.Uniform(0.1, 3)), 7);
        var obs = MockSurveyGenerator.Generate(spec, parallel: false).ToObservables();
        var h = Hypothesis.Create(WorldModels.LambdaCdm, new NuisanceModel(ObservableKind.Size), new ParameterOverrides(Free: new HashSet<string> { "omega_m" }));
        var lik = h.Bind(obs);
        var priors = h.FreeParameters.Select(q => q.Prior).ToArray();
        if (priors.Any(q => q is not UniformPrior))
            throw new InvalidOperationException("the fit problem expects uniform priors");
        return new EvidenceProblem("fit-size-4d", lik, [.. priors.Cast<UniformPrior>()], double.NaN);
    }
}

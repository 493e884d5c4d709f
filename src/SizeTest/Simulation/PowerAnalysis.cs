using SizeTest.Inference;
using SizeTest.Inference.Comparison;

namespace SizeTest.Simulation;

/// <summary>
/// Can a survey design tell the world models apart? Draws K mocks of the design under the true model for each
/// sample size N, fits every candidate by maximum likelihood (the same <see cref="Hypothesis"/> /
/// <see cref="MaximumLikelihood"/> path as <c>sizetest fit</c>), and reports how often the true model wins by
/// ΔBIC &gt; 6 and &gt; 10, the distribution of ΔBIC, the bias, spread and interval coverage of the recovered
/// evolution exponents, and the smallest N in the grid that gives a decisive result.
/// </summary>
/// <remarks>
/// <para>ΔBIC = BIC(best other candidate) − BIC(true); BIC = k ln n − 2 ln L̂ (Schwarz 1978). Thresholds 6 and 10 are
/// "strong" and "very strong" on the Kass &amp; Raftery (1995) scale for 2 ln B ≈ ΔBIC.</para>
/// <para>Verdict per N, in this order: withheld as <c>not interpretable: the true model is not recovered</c> when the true
/// model's own fit fails to recover any parameter (|bias| &gt; 2 × spread, or coverage &lt; 40%; <see cref="RecoveryFailures"/>);
/// <c>favours a wrong model</c> when the median ΔBIC is below −2; <c>decisive</c> when P(ΔBIC &gt; 10) ≥ target; <c>strong</c> when P(ΔBIC &gt; 6) ≥ target;
/// <c>unable to decide</c> when the median ΔBIC is below 2 (Kass &amp; Raftery: "not worth more than a bare mention");
/// otherwise <c>weak</c>.</para>
/// <para>Determinism: mock k has seed <see cref="SimulationRandom.DeriveSeed"/>(base seed, k) at every N (so with the
/// same seed smaller mocks are prefixes of larger ones), and fit k uses optimiser seed k; mocks run in parallel
/// (<see cref="Parallel.For(int, int, ParallelOptions, Action{int})"/>) into fixed slots, so the result does not depend on
/// the number of threads.</para>
/// </remarks>
public static class PowerAnalysis
{
    private static readonly double[] QuantileLevels = [0.05, 0.16, 0.5, 0.84, 0.95];

    /// <summary>Runs the analysis. Physics only: no I/O; progress goes to <paramref name="progress"/>.</summary>
    public static PowerResult Run(PowerRequest request, IProgress<PowerProgress>? progress = null, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(request);
        request.Validate();
        var sizes = request.SampleSizes.Distinct().Order().ToArray();
        int k = request.Mocks, total = sizes.Length * k;
        int trueIndex = request.Candidates.ToList().FindIndex(c => c.Label == request.TrueCandidate);
        var truth = TrueNuisance(request.Template);
        var recovered = request.Candidates[trueIndex].FreeParameters.Select(p => p.Name).Where(truth.ContainsKey).ToArray();
        var seeds = Enumerable.Range(0, k).Select(i => unchecked((long)SimulationRandom.DeriveSeed(request.Template.Seed, i))).ToArray();
        var outcomes = new MockOutcome[total];
        int done = 0;
        var options = new ParallelOptions { CancellationToken = cancel, MaxDegreeOfParallelism = request.MaxThreads ?? Environment.ProcessorCount };
        progress?.Report(new PowerProgress(0, total));
        try
        {
            Parallel.For(0, total, options, job =>
            {
                int n = sizes[job / k], mock = job % k;
                outcomes[job] = FitMock(request, n, mock, seeds[mock], trueIndex);
                int d = Interlocked.Increment(ref done);
                progress?.Report(new PowerProgress(d, total));
            });
        }
        catch (AggregateException ex) when (ex.InnerExceptions.Count > 0)
        {
            // Surface the first worker's error as itself (an input or analysis error keeps its exit code).
            System.Runtime.ExceptionServices.ExceptionDispatchInfo.Capture(ex.InnerExceptions[0]).Throw();
        }

        var points = new List<PowerPoint>();
        for (int s = 0; s < sizes.Length; s++)
        {
            var set = outcomes.Skip(s * k).Take(k).ToArray();
            points.Add(Summarise(sizes[s], set, truth, recovered, request.TargetPower, request.Candidates[trueIndex].Label));
        }
        int? required = points.FirstOrDefault(p => p.Verdict == "decisive")?.SampleSize;
        string trueName = request.Candidates[trueIndex].Label;
        var last = points[^1];
        var uninterpretable = points.Where(p => p.Verdict == NotInterpretable).ToArray();
        string conclusion = uninterpretable.Length > 0 && required is null
            ? FormattableString.Invariant($"{NotInterpretable} (at N = {string.Join(", ", uninterpretable.Select(p => p.SampleSize))}: {string.Join("; ", uninterpretable[^1].RecoveryFailures)}); the fitted model cannot describe these mocks (e.g. a selection that is not modelled), so no power is claimed")
            : last.Verdict == FavoursWrongModel && required is null
            ? FormattableString.Invariant($"favours a wrong model: at N = {last.SampleSize} the median ΔBIC is {last.DeltaBicQuantiles[2]:F1}, so mocks drawn from {trueName} prefer another candidate (the candidates or the mocks' selection are not what the fit assumes)")
            : required is { } r
            ? FormattableString.Invariant($"a sample of N = {r} decides: the true model {trueName} wins by ΔBIC > 10 in {points.First(p => p.SampleSize == r).ProbabilityDecisive:P0} of mocks (target {request.TargetPower:P0})")
            : last.Verdict == "unable to decide"
                ? FormattableString.Invariant($"unable to decide: even at N = {last.SampleSize} the median ΔBIC is {last.DeltaBicQuantiles[2]:F1} and the true model {trueName} wins by ΔBIC > 10 in only {last.ProbabilityDecisive:P0} of mocks; this design cannot tell the models apart (widen the redshift range, add objects, or constrain the evolution the models may use)")
                : FormattableString.Invariant($"no N in the grid is decisive: at N = {last.SampleSize} the true model {trueName} wins by ΔBIC > 10 in {last.ProbabilityDecisive:P0} of mocks (target {request.TargetPower:P0}); try larger N");
        var notes = new List<string>
        {
            "ΔBIC = BIC(best other candidate) − BIC(true model); thresholds 6 and 10 follow Kass & Raftery (1995) for 2 ln B ≈ ΔBIC",
            "intervals are the fitter's Hessian ±1σ (nominal coverage 68.3%)",
            "mock k has the same seed at every N, so the smaller mocks are the first objects of the larger ones",
        };
        var first = request.Candidates[0].Nuisance;
        var cuts = request.Template.Design.Cuts;
        if (cuts.SbLimit is not null && first.Cuts.SbLimit is null) notes.Add("the mocks have an SB limit that the fitted observable cannot model; estimates may be biased");
        if (cuts.MagLimit is not null && first.Cuts.MagLimit is null) notes.Add("the mocks have a magnitude limit that the fitted observable cannot model; estimates may be biased");
        if (cuts.MinThetaArcsec is not null && first.Cuts.MinThetaArcsec is null) notes.Add("the mocks have a minimum size that the fitted observable cannot model; estimates may be biased");
        if (request.Template.Design.MeasurementErrors.PhotoZError > 0 && request.Survey is null) notes.Add("photometric-redshift errors are simulated but not modelled by the fit");
        if (request.Survey is { } asked)
            notes.Add("the fits take the survey terms of the design, as fit would: " + string.Join(", ", PowerCandidates.SurveyWords(asked, request.Template)) +
                      (request.Template.SurveyTruth.LuminosityFunction is not null && first.Observable != ObservableKind.Size
                          ? "; μ follows from the mocks' photometry, so the surface-brightness truths are the values it implies (γ = 1 − 2β, b = −2a for FLRW, σ_μ = 5 σ_R)" : ""));
        return new PowerResult
        {
            TrueModel = request.Template.Model.Name,
            TrueModelParameters = request.Template.Model.ParameterValues.ToDictionary(p => p.Key, p => p.Value),
            TrueNuisance = truth,
            Candidates = request.Candidates.Select(c => c.Label).ToArray(),
            TrueCandidate = trueName,
            Observable = first.Observable,
            Kind = request.Template.Design.Kind == MockObjectKind.Galaxy ? "galaxy" : "radio",
            ZDist = request.Template.Design.Redshifts.Text,
            Seed = request.Template.Seed,
            Mocks = k,
            TargetPower = request.TargetPower,
            StrongDeltaBic = StrongDeltaBic,
            DecisiveDeltaBic = DecisiveDeltaBic,
            Points = points,
            RequiredSampleSize = required,
            Conclusion = conclusion,
            Notes = notes,
            Outcomes = outcomes,
        };
    }

    /// <summary>The true values of the fit's nuisance parameters implied by the template's population.</summary>
    public static Dictionary<string, double> TrueNuisance(MockSurveySpec spec)
    {
        ArgumentNullException.ThrowIfNull(spec);
        if (spec.Design.Kind == MockObjectKind.CompactRadio)
        {
            var r = spec.RadioTruth;
            return new Dictionary<string, double>
            {
                [NuisanceParameters.Names.R0Kpc] = r.LinearSizePc / 1000.0,
                [NuisanceParameters.Names.SizeEvolution] = r.SizeEvolution,
                [NuisanceParameters.Names.ScatterDex] = r.ScatterDex,
            };
        }
        var g = spec.GalaxyTruth;
        var sv = spec.SurveyTruth;
        var truth = new Dictionary<string, double> { [NuisanceParameters.Names.KormendySlope] = g.KormendySlope };
        // One population's truths (names with @GROUP for a mixed sample). With a luminosity function μ follows from the photometry:
        // its SB truths are the ones that implies (PhotometricSurfaceBrightness), and the relation's slopes are truths too.
        void Add(string suffix, double r0, double a, double beta, double scatter)
        {
            truth[NuisanceParameters.Names.R0Kpc + suffix] = r0;
            truth[NuisanceParameters.Names.SizeEvolution + suffix] = a;
            truth[NuisanceParameters.Names.ScatterDex + suffix] = scatter;
            if (sv.LuminosityFunction is null)
            {
                truth[NuisanceParameters.Names.Mu0 + suffix] = g.Mu0;
                truth[NuisanceParameters.Names.SbEvolution + suffix] = g.SbEvolution;
                truth[NuisanceParameters.Names.ScatterMag + suffix] = g.ScatterMag;
                return;
            }
            var implied = PhotometricSurfaceBrightness.For(spec.Model, sv.PivotAbsMag, r0, a, beta, scatter);
            truth[NuisanceParameters.Names.SizeLuminositySlope + suffix] = beta;
            truth[NuisanceParameters.Names.Mu0 + suffix] = implied.Mu0;
            truth[NuisanceParameters.Names.SbEvolution + suffix] = implied.SbEvolution;
            truth[NuisanceParameters.Names.SbLuminositySlope + suffix] = implied.SbLuminositySlope;
            truth[NuisanceParameters.Names.ScatterMag + suffix] = implied.ScatterMag;
        }
        if (sv.Groups.Count == 0) Add("", g.R0Kpc, g.SizeEvolution, sv.SizeLuminositySlope, g.ScatterDex);
        foreach (var p in sv.Groups) Add("@" + p.Name, p.R0Kpc, p.SizeEvolution, p.SizeLuminositySlope, p.ScatterDex);
        return truth;
    }

    private static MockOutcome FitMock(PowerRequest request, int n, int mock, long seed, int trueIndex)
    {
        var spec = request.Template with { Seed = seed, Design = request.Template.Design with { Count = n } };
        var catalogue = MockSurveyGenerator.Generate(spec, parallel: false);
        var obs = catalogue.ToObservables();
        var candidates = request.Candidates;
        bool converged = true;
        if (request.Survey is { } survey)
        {
            // The survey terms of this mock, as fit builds them for a catalogue (group labels, the photo-z prior estimated from it).
            var model = survey.Build(obs, candidates[0].Nuisance.Observable, new List<string>());
            candidates = candidates.Select(h => h.WithNuisance(h.Nuisance with { Survey = model })).ToArray();
            converged = model.RedshiftPopulation?.Converged ?? true; // a prior whose EM hit its cap counts as a fit that did not converge
        }
        var bic = new double[request.Candidates.Count];
        IReadOnlyList<ParameterEstimate> estimates = [];
        var settings = new OptimizerSettings(Starts: request.Starts, Seed: mock + 1);
        for (int c = 0; c < request.Candidates.Count; c++)
        {
            var h = candidates[c];
            var lik = h.Bind(obs);
            bool isTrue = c == trueIndex;
            MaximumLikelihoodResult fit;
            try
            {
                fit = MaximumLikelihood.Fit(lik, settings, covariance: isTrue);
            }
            catch (ArgumentException)
            {
                bic[c] = double.PositiveInfinity;
                converged = false;
                continue;
            }
            bic[c] = double.IsFinite(fit.LogLikelihood) ? InformationCriteria.Bic(fit.LogLikelihood, h.K, lik.ModelWeights(0, lik.Count).Objects) : double.PositiveInfinity;
            converged &= fit.Converged;
            if (isTrue) estimates = FitSummaries.From(lik, fit).Parameters.Where(p => !p.Fixed).ToArray();
        }
        double bestOther = double.PositiveInfinity;
        int winner = trueIndex;
        for (int c = 0; c < bic.Length; c++)
        {
            if (c != trueIndex) bestOther = Math.Min(bestOther, bic[c]);
            if (bic[c] < bic[winner]) winner = c;
        }
        double delta = bestOther - bic[trueIndex];
        return new MockOutcome(n, mock, seed, request.Candidates[winner].Label, delta, bic, converged, estimates);
    }

    private static PowerPoint Summarise(int n, MockOutcome[] set, Dictionary<string, double> truth, string[] recovered, double target, string trueName)
    {
        int k = set.Length;
        var deltas = set.Select(o => double.IsNaN(o.DeltaBic) ? double.NegativeInfinity : o.DeltaBic).Order().ToArray();
        double pBest = set.Count(o => o.Winner == trueName) / (double)k;
        double p6 = set.Count(o => o.DeltaBic > StrongDeltaBic) / (double)k;
        double p10 = set.Count(o => o.DeltaBic > DecisiveDeltaBic) / (double)k;
        var q = QuantileLevels.Select(l => Quantile(deltas, l)).ToArray();
        var finite = deltas.Where(double.IsFinite).ToArray();
        double mean = finite.Length > 0 ? finite.Average() : double.NaN;
        var rec = new List<ParameterRecovery>();
        foreach (var name in recovered)
        {
            var est = set.Select(o => o.Estimates.FirstOrDefault(e => e.Name == name)).Where(e => e is not null && double.IsFinite(e.Value)).Select(e => e!).ToArray();
            if (est.Length == 0) continue;
            double t = truth[name];
            var values = est.Select(e => e.Value).ToArray();
            double m = values.Average();
            double sd = values.Length > 1 ? Math.Sqrt(values.Sum(v => (v - m) * (v - m)) / (values.Length - 1)) : double.NaN;
            var withInterval = est.Where(e => double.IsFinite(e.Lo) && double.IsFinite(e.Hi)).ToArray();
            double coverage = withInterval.Length > 0 ? withInterval.Count(e => e.Lo <= t && t <= e.Hi) / (double)withInterval.Length : double.NaN;
            var halfWidths = withInterval.Select(e => 0.5 * (e.Hi - e.Lo)).Order().ToArray();
            rec.Add(new ParameterRecovery(name, t, m - t, sd / Math.Sqrt(values.Length), sd, halfWidths.Length > 0 ? Quantile(halfWidths, 0.5) : double.NaN, coverage, withInterval.Length));
        }
        var failures = RecoveryFailures(rec);
        string verdict = Verdict(failures.Count > 0, q[2], p6, p10, target);
        return new PowerPoint(n, k, pBest, p6, p10, q, mean, rec, set.Count(o => !o.Converged), verdict) { RecoveryFailures = failures };
    }

    /// <summary>ΔBIC a "strong" win needs (Kass &amp; Raftery 1995: 2 ln B &gt; 6); written to power.json as <c>strong_delta_bic</c>.</summary>
    public const double StrongDeltaBic = 6;

    /// <summary>ΔBIC a "decisive" win needs (Kass &amp; Raftery 1995, "very strong": 2 ln B &gt; 10); power.json <c>decisive_delta_bic</c>.</summary>
    public const double DecisiveDeltaBic = 10;

    /// <summary>The verdict withheld when the true model's own fit does not recover the truth.</summary>
    public const string NotInterpretable = "not interpretable: the true model is not recovered";

    /// <summary>The verdict when the median ΔBIC is below −2: the mocks, drawn from the true model, prefer another one.</summary>
    public const string FavoursWrongModel = "favours a wrong model";

    /// <summary>Fewest mocks with intervals from which the coverage is judged (<see cref="RecoveryFailures"/>).</summary>
    public const int MinimumCoverageMocks = 10;

    /// <summary>The verdict of one sample size (order as in the class remarks).</summary>
    /// <param name="recoveryFailed">The true model failed to recover some parameter (<see cref="RecoveryFailures"/>).</param>
    /// <param name="medianDeltaBic">Median ΔBIC over the mocks.</param>
    /// <param name="probabilityStrong">P(ΔBIC &gt; 6).</param>
    /// <param name="probabilityDecisive">P(ΔBIC &gt; 10).</param>
    /// <param name="target">Target power.</param>
    public static string Verdict(bool recoveryFailed, double medianDeltaBic, double probabilityStrong, double probabilityDecisive, double target) =>
        recoveryFailed ? NotInterpretable
        : medianDeltaBic < -2 ? FavoursWrongModel
        : probabilityDecisive >= target ? "decisive" : probabilityStrong >= target ? "strong" : medianDeltaBic < 2 ? "unable to decide" : "weak";

    /// <summary>
    /// The parameters the true model fails to recover: |bias| &gt; 2 × spread (the estimates sit away from the truth by
    /// more than twice their scatter), or 68% intervals covering the truth in fewer than 40% of mocks (binomially
    /// impossible for honest 68% intervals once K ≳ 10: P(≤ 40% | 68%) &lt; 3% at K = 10). Coverage is judged from
    /// <see cref="MinimumCoverageMocks"/> mocks with intervals on: below that one mock moves it by more than 10%, and a survey
    /// design with many parameters reaches a low count by chance (1 of 6 has P = 1.5% per parameter for honest intervals).
    /// </summary>
    public static IReadOnlyList<string> RecoveryFailures(IEnumerable<ParameterRecovery> recovery)
    {
        ArgumentNullException.ThrowIfNull(recovery);
        var list = new List<string>();
        foreach (var r in recovery)
        {
            if (double.IsFinite(r.Spread) && Math.Abs(r.Bias) > 2 * r.Spread)
                list.Add(FormattableString.Invariant($"{r.Name}: bias {r.Bias:+0.###;-0.###} is more than twice the spread {r.Spread:0.###}"));
            else if (double.IsFinite(r.Coverage) && r.CoverageCount >= MinimumCoverageMocks && r.Coverage < 0.4)
                list.Add(FormattableString.Invariant($"{r.Name}: 68% intervals cover the truth in only {r.Coverage:P0} of mocks"));
        }
        return list;
    }

    /// <summary>Linear-interpolation quantile of sorted values (type 7 of Hyndman &amp; Fan 1996).</summary>
    private static double Quantile(double[] sorted, double p)
    {
        if (sorted.Length == 0) return double.NaN;
        double h = (sorted.Length - 1) * p;
        int lo = (int)Math.Floor(h), hi = Math.Min(lo + 1, sorted.Length - 1);
        if (double.IsNegativeInfinity(sorted[lo]) || double.IsPositiveInfinity(sorted[hi])) return sorted[h - lo < 0.5 ? lo : hi];
        return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
    }
}

using SizeTest.Inference;
using SizeTest.Photometry;

namespace SizeTest.Distributed;

/// <summary>
/// The fit study of <see cref="FitStudy"/> with the sample spread over ranks: every model's multi-start maximum
/// likelihood and Hessian, the nested fits of the likelihood-ratio tests, the required evolution, the optional posterior
/// sampler and a Poisson bootstrap, ranked as in a single process and returned as the same <see cref="StudyResult"/>.
/// </summary>
/// <remarks>
/// <para>Each target (a model, a nested model, a bootstrap replicate) is one session of a <see cref="DistributedLogDensity"/>:
/// every rank binds a <see cref="HypothesisLikelihood"/> to its own objects, rank 0 drives the optimiser or sampler of the
/// inference stage and every evaluation is one broadcast and one Allreduce; the other ranks serve the evaluations. All ranks
/// walk the same list of targets, which depends only on the hypotheses and the request, never on results.</para>
/// <para>The D_A grid of free-cosmology fits spans the whole sample's redshift range on every rank
/// (<see cref="RedshiftGridSpan"/>, bounds gathered over the ranks) with the whole sample's node count, so ln L does not
/// depend on the split beyond rounding.</para>
/// <para>Not run across ranks: cross-validation and profile likelihoods (each needs many refits of re-partitioned data);
/// they are skipped and a note says so. The bootstrap is the Poisson bootstrap of
/// <see cref="PoissonBootstrapWeights"/>, not the single-process multinomial resampling.</para>
/// </remarks>
public static class DistributedFitStudy
{
    private static readonly string[] EvolutionParameters = ["size_evolution", "sb_evolution"];

    /// <summary>Runs the study; every rank must call it with the same hypotheses and settings.</summary>
    /// <param name="ranks">The rank layer.</param>
    /// <param name="request">The study, with <see cref="FitRequest.Observables"/> = this rank's objects (possibly none) and
    /// <see cref="FitRequest.RowsRead"/>/<see cref="FitRequest.Rejected"/> = the all-rank totals.</param>
    /// <param name="globalRows">A rank-independent row identity per local object (the catalogue's file row numbers), which
    /// seeds the bootstrap weights.</param>
    /// <param name="startSample">On rank 0, a sample to take the data-driven starting point from (the whole sample when it is
    /// loaded anyway); null uses rank 0's own objects.</param>
    /// <param name="progress">Progress sink (rank 0).</param>
    /// <param name="cancel">Cancellation (rank 0; cancelling aborts the collective run).</param>
    /// <returns>The result on rank 0, null on the other ranks.</returns>
    public static StudyResult? Run(IRankReducer ranks, FitRequest request, IReadOnlyList<long> globalRows, Observables? startSample = null,
        IProgress<FitProgress>? progress = null, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(ranks);
        ArgumentNullException.ThrowIfNull(request);
        ArgumentNullException.ThrowIfNull(globalRows);
        if (request.Hypotheses.Count == 0) throw new ArgumentException("no world models to fit");
        var obs = request.Observables;
        if (globalRows.Count != obs.Count) throw new ArgumentException($"{globalRows.Count} row identities for {obs.Count} objects", nameof(globalRows));
        bool root = ranks.IsRoot;
        var span = SharedSpan(ranks, obs);
        int total = span.ObjectCount;
        if (total == 0) throw new Common.InputException("the sample has no accepted objects to fit");

        var summaries = new List<ModelFitSummary>();
        var lrts = new List<LikelihoodRatioTest>();
        var boots = new List<BootstrapResult>();
        var required = new List<RequiredEvolution>();
        var samples = new List<PosteriorDraws>();
        var opt = new OptimizerSettings(Starts: request.Starts, Seed: request.Seed);
        int m = 0;
        foreach (var h in request.Hypotheses)
        {
            if (root) progress?.Report(new FitProgress($"fitting {h.Label}", m, request.Hypotheses.Count));
            MaximumLikelihoodResult? fit = null;
            ModelFitSummary? summary = null;
            int seedM = unchecked(request.Seed + 31 * m);
            Session(ranks, h, Bind(h, obs, span), target =>
            {
                cancel.ThrowIfCancellationRequested();
                var start = startSample is { Count: > 0 } whole ? new HypothesisLikelihood(h, whole, span).SuggestStart()
                    : obs.Count > 0 ? new HypothesisLikelihood(h, obs, span).SuggestStart() : h.StartVector();
                fit = MaximumLikelihood.Fit(target.Likelihood, target.Posterior, h.FreeParameters, start, opt);
                summary = FitSummaries.From(h, total, fit);
                if (request.Sampler != "none")
                {
                    var (sampled, draws) = PosteriorSampling.Run(h, target.Likelihood, target.Posterior, fit, summary, request, seedM, progress, cancel);
                    summary = sampled;
                    if (draws is not null) samples.Add(draws);
                }
                summaries.Add(summary);
            });

            foreach (var name in EvolutionParameters)
            {
                var p = h.Parameters.FirstOrDefault(x => x.Name == name);
                if (p is null) continue;
                LikelihoodRatioTest? lrt = null;
                if (p.IsFree && p.Min <= 0 && p.Max >= 0)
                {
                    var nested = h.WithFixed(name, 0);
                    Session(ranks, nested, Bind(nested, obs, span), target =>
                    {
                        int j = h.FreeParameters.ToList().FindIndex(q => q.Name == name);
                        var start = fit!.Theta.Where((_, k) => k != j).ToArray();
                        var nfit = MaximumLikelihood.Fit(target.Likelihood, target.Posterior, nested.FreeParameters, start, opt, covariance: false);
                        lrt = LikelihoodRatioTest.Compute(h.Label, name, 0, fit.LogLikelihood, nfit.LogLikelihood, 1);
                        lrts.Add(lrt);
                    });
                }
                if (root)
                {
                    var est = summary!.Parameters.First(q => q.Name == name);
                    required.Add(RequiredEvolution.Assess(h.Label, est, lrt, request.Expected.FirstOrDefault(e => e.Parameter == name)));
                }
            }

            if (request.Bootstrap > 0 && h.K > 0)
                boots.Add(PoissonBootstrap(ranks, h, obs, globalRows, span, fit, request.Bootstrap, unchecked(request.Seed + 7 * m), progress, cancel)!);
            m++;
            if (root) progress?.Report(new FitProgress($"fitted {h.Label}", m, request.Hypotheses.Count));
        }
        if (!root) return null;

        var ranked = ModelComparison.Rank(summaries);
        var first = request.Hypotheses[0].Nuisance;
        var notes = FitStudy.StudyNotes(request.Hypotheses, ranked, request.Sampler);
        notes.Add($"fitted on {ranks.Description}: each rank summed the likelihood of its own rows (Parquet: whole row groups; other formats: row ranges) and one Allreduce per evaluation added them");
        if (request.Bootstrap > 0)
            notes.Add("the bootstrap is a Poisson bootstrap: each replicate weights every row by a Poisson(1) count drawn from (seed, replicate, file row), so it does not depend on the number of ranks (it differs from the single-process multinomial resampling)");
        if (request.CrossValidationFolds > 1)
            notes.Add("cross-validation is not run under MPI (skipped; run the fit as a single process for it)");
        if (request.ProfileParameter is not null)
            notes.Add($"the profile likelihood of {request.ProfileParameter} is not run under MPI (skipped; run the fit as a single process for it)");
        return new StudyResult
        {
            Source = request.Source,
            RowsRead = request.RowsRead ?? total + request.Rejected,
            Accepted = total,
            Rejected = request.Rejected,
            Seed = request.Seed,
            Settings = new FitSettings(
                first.Observable switch { ObservableKind.Size => "size", ObservableKind.SurfaceBrightness => "sb", _ => "joint" },
                first.Cuts, first.SizeSbRelation, first.PivotSizeKpc, first.DimmingExponentOffset, first.NodesFor(total),
                request.Starts, request.Bootstrap, 0, request.Sampler, request.Walkers, request.Steps, request.LivePoints,
                null, request.Expected, request.Seed),
            Models = ranked,
            BayesFactors = ModelComparison.BayesFactors(ranked),
            LikelihoodRatioTests = lrts,
            RequiredEvolution = required,
            Bootstrap = boots,
            Notes = notes,
            Samples = samples,
        };
    }

    // Replicate b: every rank refits with its rows weighted by Poisson(1) counts (rows repeated w_i times); rank 0 drives
    // a one-start refit from the full-sample maximum, as the single-process bootstrap does.
    private static BootstrapResult? PoissonBootstrap(IRankReducer ranks, Hypothesis h, Observables obs, IReadOnlyList<long> globalRows,
        RedshiftGridSpan span, MaximumLikelihoodResult? fit, int resamples, int seed, IProgress<FitProgress>? progress, CancellationToken cancel)
    {
        int d = h.K;
        var thetas = new double[resamples][];
        var ok = new bool[resamples];
        var settings = new OptimizerSettings(Starts: 1, Tolerance: 1e-9, InitialStep: 0.1);
        string stage = $"bootstrap {h.Label}";
        if (ranks.IsRoot) progress?.Report(new FitProgress(stage, 0, resamples));
        for (int b = 0; b < resamples; b++)
        {
            var rows = PoissonBootstrapWeights.Rows(seed, b, globalRows);
            var local = rows.Length > 0 ? new HypothesisLikelihood(h, ObservablesSubset.Take(obs, rows), span) : null;
            int i = b;
            Session(ranks, h, local, target =>
            {
                cancel.ThrowIfCancellationRequested();
                var r = MaximumLikelihood.Fit(target.Likelihood, target.Posterior, h.FreeParameters, fit!.Theta, settings, covariance: false);
                thetas[i] = r.Theta;
                ok[i] = r.Converged;
            });
            if (ranks.IsRoot) progress?.Report(new FitProgress(stage, b + 1, resamples));
        }
        if (!ranks.IsRoot) return null;
        var good = Enumerable.Range(0, resamples).Where(i => ok[i]).Select(i => thetas[i]).ToArray();
        var intervals = new List<BootstrapInterval>();
        for (int j = 0; j < d; j++)
        {
            var col = good.Select(t => t[j]).OrderBy(v => v).ToArray();
            string name = h.FreeParameters[j].Name;
            if (col.Length == 0) { intervals.Add(new BootstrapInterval(name, double.NaN, double.NaN, double.NaN, double.NaN)); continue; }
            double mean = col.Average();
            double sd = col.Length > 1 ? Math.Sqrt(col.Sum(v => (v - mean) * (v - mean)) / (col.Length - 1)) : double.NaN;
            intervals.Add(new BootstrapInterval(name, Bootstrap.Quantile(col, 0.5), Bootstrap.Quantile(col, 0.16), Bootstrap.Quantile(col, 0.84), sd));
        }
        return new BootstrapResult(h.Label, resamples, resamples - good.Length, intervals);
    }

    private static HypothesisLikelihood? Bind(Hypothesis h, Observables obs, RedshiftGridSpan span) =>
        obs.Count > 0 ? new HypothesisLikelihood(h, obs, span) : null;

    // The whole sample's redshift range and size: each rank's min and max travel in its own slots of one Allreduce.
    private static RedshiftGridSpan SharedSpan(IRankReducer ranks, Observables obs)
    {
        int size = ranks.Size;
        var local = new double[2 * size + 1];
        var all = new double[local.Length];
        if (obs.Count > 0)
        {
            local[2 * ranks.Rank] = obs.Z.Min();
            local[2 * ranks.Rank + 1] = obs.Z.Max();
        }
        local[2 * size] = obs.Count;
        ranks.SumAll(local, all);
        double lo = double.PositiveInfinity, hi = double.NegativeInfinity;
        for (int r = 0; r < size; r++)
        {
            if (all[2 * r + 1] == 0 && all[2 * r] == 0) continue; // a rank without objects
            lo = Math.Min(lo, all[2 * r]);
            hi = Math.Max(hi, all[2 * r + 1]);
        }
        return new RedshiftGridSpan(lo, hi, (int)all[2 * size]);
    }

    // One collective session: rank 0 runs `drive` against the all-rank sum, the others serve until it stops.
    private static void Session(IRankReducer ranks, Hypothesis h, HypothesisLikelihood? local, Action<Target> drive)
    {
        int d = h.K;
        var sum = new DistributedLogDensity(ranks, Math.Max(1, d), theta => local?.LogDensity(theta.AsSpan(0, d)) ?? 0.0);
        if (!ranks.IsRoot)
        {
            sum.Serve();
            return;
        }
        var likelihood = new FirstCoordinates(sum, d);
        drive(new Target(likelihood, new WithPriors(likelihood, h.FreeParameters.Select(p => p.Prior).ToArray())));
        sum.Stop(); // not reached after an exception: the caller aborts the ranks
    }

    private sealed record Target(ILogDensity Likelihood, ILogDensity Posterior);

    // Dimension d over a distributed density of dimension max(1, d) (d = 0 pads one unused coordinate).
    private sealed class FirstCoordinates(DistributedLogDensity inner, int d) : ILogDensity
    {
        public int Dimension => d;

        public double LogDensity(ReadOnlySpan<double> theta)
        {
            if (d > 0) return inner.LogDensity(theta);
            Span<double> pad = stackalloc double[1];
            return inner.LogDensity(pad);
        }
    }

    // ln L + Σ ln prior, added once on rank 0; outside a prior's support the ranks are not asked at all.
    private sealed class WithPriors(ILogDensity likelihood, ParameterPrior[] priors) : ILogDensity
    {
        public int Dimension => likelihood.Dimension;

        public double LogDensity(ReadOnlySpan<double> theta)
        {
            double lp = 0;
            for (int j = 0; j < priors.Length; j++)
            {
                lp += priors[j].LogDensity(theta[j]);
                if (double.IsNegativeInfinity(lp)) return lp;
            }
            return lp + likelihood.LogDensity(theta);
        }
    }
}

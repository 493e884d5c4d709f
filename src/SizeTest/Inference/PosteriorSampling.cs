using SizeTest.Inference.Sampling;

namespace SizeTest.Inference;

/// <summary>Posterior samples kept for writing (not part of results.json).</summary>
/// <param name="Model">Model name.</param>
/// <param name="Sampler">The sampler that drew them (<see cref="SamplerKind.Mcmc"/> or <see cref="SamplerKind.Nested"/>).</param>
/// <param name="ParameterNames">Free-parameter names, in column order.</param>
/// <param name="Rows">Nested sampling: the weighted samples (θ…, ln L, ln weight); MCMC: the kept draws after the burn-in
/// (θ…, ln posterior), every walker at every step, thinned by a whole stride to at most <see cref="PosteriorSampling.MaxKeptDraws"/>
/// rows — the draws the corner plot shows (the full chain goes to the chain store).</param>
public sealed record PosteriorDraws(string Model, SamplerKind Sampler, IReadOnlyList<string> ParameterNames, IReadOnlyList<double[]> Rows)
{
    /// <summary>MCMC: the run's length, burn-in and convergence numbers; null for nested sampling.</summary>
    public ChainSummary? Chain { get; init; }
}

/// <summary>
/// Runs the samplers of <c>Inference/Sampling</c> on a fitted hypothesis and folds their results into the
/// model's summary: parameter values become posterior medians with 16th–84th percentile intervals, the fit is
/// converged only when the sampler's diagnostics say so, and the evidence (nested sampling, or the Laplace
/// approximation at the maximum for MCMC) fills <see cref="ModelFitSummary.LogEvidence"/>.
/// </summary>
public static class PosteriorSampling
{
    /// <summary>Most MCMC draws kept in <see cref="PosteriorDraws.Rows"/> (for figures).</summary>
    public const int MaxKeptDraws = 4000;

    /// <summary>Samples the posterior of <paramref name="likelihood"/> starting from the fit.</summary>
    /// <param name="likelihood">The bound hypothesis.</param>
    /// <param name="fit">Its maximum-likelihood fit.</param>
    /// <param name="summary">Its summary (replaced fields are returned in a copy).</param>
    /// <param name="request">Sampler kind and sizes, seed, chain-store factory.</param>
    /// <param name="seed">Seed for this model.</param>
    /// <param name="progress">Progress sink.</param>
    /// <param name="cancel">Cancellation.</param>
    public static (ModelFitSummary Summary, PosteriorDraws? Samples) Run(HypothesisLikelihood likelihood, MaximumLikelihoodResult fit,
        ModelFitSummary summary, FitRequest request, int seed, IProgress<FitProgress>? progress, CancellationToken cancel)
    {
        ArgumentNullException.ThrowIfNull(likelihood);
        return Run(likelihood.Hypothesis, likelihood, likelihood.Posterior, fit, summary, request, seed, progress, cancel);
    }

    /// <summary>
    /// As <see cref="Run(HypothesisLikelihood, MaximumLikelihoodResult, ModelFitSummary, FitRequest, int, IProgress{FitProgress}?, CancellationToken)"/>
    /// for a likelihood given as any <see cref="ILogDensity"/> over <paramref name="h"/>'s free parameters (e.g. a sum over MPI ranks).
    /// </summary>
    /// <param name="h">The hypothesis (free parameters, priors, label).</param>
    /// <param name="likelihood">ln L over the free parameters.</param>
    /// <param name="posterior">ln L + ln prior.</param>
    /// <param name="fit">Its maximum-likelihood fit.</param>
    /// <param name="summary">Its summary (replaced fields are returned in a copy).</param>
    /// <param name="request">Sampler kind and sizes, chain-store factory (its observables are not used).</param>
    /// <param name="seed">Seed for this model.</param>
    /// <param name="progress">Progress sink.</param>
    /// <param name="cancel">Cancellation.</param>
    public static (ModelFitSummary Summary, PosteriorDraws? Samples) Run(Hypothesis h, ILogDensity likelihood, ILogDensity posterior, MaximumLikelihoodResult fit,
        ModelFitSummary summary, FitRequest request, int seed, IProgress<FitProgress>? progress, CancellationToken cancel)
    {
        ArgumentNullException.ThrowIfNull(h);
        ArgumentNullException.ThrowIfNull(likelihood);
        ArgumentNullException.ThrowIfNull(posterior);
        ArgumentNullException.ThrowIfNull(fit);
        ArgumentNullException.ThrowIfNull(summary);
        ArgumentNullException.ThrowIfNull(request);
        var priors = h.FreeParameters.Select(p => p.Prior).ToArray();
        var names = h.FreeParameters.Select(p => p.Name).ToArray();
        int d = names.Length;
        if (d == 0 || request.Sampler == SamplerKind.None) return (summary, null);
        string label = h.Label;
        Func<int, double> p16, p50, p84;
        bool converged;
        string verdict;
        double? lnZ = null, lnZErr = null;
        PosteriorDraws? samples = null;
        if (request.Sampler == SamplerKind.Mcmc)
        {
            var scale = Enumerable.Range(0, d).Select(j =>
            {
                double se = fit.StandardError(j);
                var p = h.FreeParameters[j];
                return double.IsFinite(se) && se > 0 ? Math.Min(se, 0.1 * (p.Max - p.Min)) : 1e-3 * (p.Max - p.Min);
            }).ToArray();
            // Start from the Laplace approximation N(θ̂, Σ) (inside the support) so the burn-in is short; a small
            // per-parameter ball when the Hessian gave no covariance.
            var start = fit.Covariance is { } cov
                ? EnsembleSampler.GaussianStart(posterior, fit.Theta, cov, request.Walkers, seed)
                : EnsembleSampler.GaussianBall(posterior, fit.Theta, scale.Select(s => 1e-2 * s).ToArray(), request.Walkers, seed);
            bool auto = request.Steps <= 0;
            int maxSteps = auto ? Math.Max(request.MaxSteps, 10) : request.Steps;
            ChainMemory.Check(request.Walkers, maxSteps, d, request.ChainMemoryBudget);
            var sampler = new EnsembleSampler(posterior, new EnsembleSamplerOptions
            {
                Walkers = request.Walkers,
                Steps = auto ? Math.Min(ChainMemory.FirstBlockSteps, maxSteps) : request.Steps,
                MaxSteps = auto ? maxSteps : null,
                Seed = seed,
                ParameterNames = names,
                Move = request.SamplerMove ?? MixtureMove.Default(),
                MaxDegreeOfParallelism = request.Backend is { Concurrent: false } ? 1 : -1,
            });
            var store = request.ChainStoreFactory?.Invoke(label);
            EnsembleRun run;
            try
            {
                string stage = $"mcmc {label}";
                run = sampler.Run(start, new Progress(progress, stage), cancel, store);
            }
            finally
            {
                (store as IDisposable)?.Dispose();
            }
            p16 = j => run.Percentile(j, 16);
            p50 = j => run.Percentile(j, 50);
            p84 = j => run.Percentile(j, 84);
            converged = run.Converged;
            int stepsRun = run.Chain.Steps;
            var diag = run.Diagnostics;
            string length = auto
                ? (converged ? $"ran to convergence: {stepsRun} steps" : $"not converged within the limit of {maxSteps} steps: {stepsRun} steps")
                : $"{stepsRun} steps (fixed)";
            verdict = $"ensemble MCMC ({request.Walkers} walkers, moves {run.MoveName}, {length}, first {run.BurnIn} discarded as burn-in, acceptance {run.AcceptanceFraction:0.00}): {diag.Verdict.Summary}";
            if (LaplaceEvidence.TryCompute(likelihood, priors, fit.Theta, out var laplace, out var failure))
                lnZ = laplace.LogEvidence;
            else verdict += $"; Laplace evidence not available ({failure})";
            double maxTau = diag.MaxTau;
            var chain = new ChainSummary(label, request.Walkers, stepsRun, run.BurnIn, auto, maxSteps, converged,
                maxTau, double.IsFinite(maxTau) && maxTau > 0 ? diag.Steps / maxTau : double.NaN,
                diag.Parameters.Count == 0 ? double.NaN : diag.Parameters.Max(p => p.SplitRhat),
                diag.Parameters.Count == 0 ? double.NaN : diag.Parameters.Min(p => p.MinEss),
                run.AcceptanceFraction);
            samples = new PosteriorDraws(label, SamplerKind.Mcmc, names, KeptDraws(run)) { Chain = chain };
        }
        else if (request.Sampler == SamplerKind.Nested)
        {
            var ns = new NestedSampler(likelihood, priors, new NestedSamplerOptions
            {
                LivePoints = request.LivePoints,
                Seed = seed,
                ParameterNames = names,
            });
            string stage = $"nested {label}";
            var ev = ns.Run(new Progress<NestedProgress>(p => progress?.Report(new FitProgress(stage, p.Iteration, 0))), cancel);
            p16 = j => ev.Percentile(j, 16);
            p50 = j => ev.Percentile(j, 50);
            p84 = j => ev.Percentile(j, 84);
            converged = ev.Converged;
            verdict = $"nested sampling ({request.LivePoints} live points): {(ev.Converged ? "converged" : "not converged")} ({ev.ExitReason})";
            lnZ = ev.LogEvidence;
            lnZErr = ev.LogEvidenceError;
            samples = new PosteriorDraws(label, SamplerKind.Nested, names,
                ev.WeightedDraws.Select(w => w.Theta.Concat([w.LogLikelihood, w.LogWeight]).ToArray()).ToArray());
        }
        else throw new ArgumentException($"sampler {request.Sampler} is not run here");

        var parameters = summary.Parameters.Select(p =>
        {
            int j = Array.IndexOf(names, p.Name);
            return j < 0 || p.Fixed ? p : p with { Value = p50(j), Lo = p16(j), Hi = p84(j) };
        }).ToArray();
        // A value the model derives (e.g. omega_lambda = 1 − omega_m when flat) follows the reported point: at the posterior
        // medians, not at the maximum the other parameters no longer show (for a one-parameter monotonic map, such as
        // flatness, this is the derived quantity's own posterior median).
        var medians = h.FullValues(Enumerable.Range(0, d).Select(p50).ToArray());
        for (int i = 0; i < parameters.Length; i++)
        {
            int full = h.Parameters.ToList().FindIndex(q => q.Name == parameters[i].Name);
            if (full < 0 || h.Parameters[full].IsFree || !double.IsNaN(h.Parameters[full].Value)) continue;
            double derived = FitSummaries.DerivedValue(h, medians, parameters[i].Name);
            parameters[i] = parameters[i] with { Value = derived, Lo = derived, Hi = derived };
        }
        return (summary with
        {
            Parameters = parameters,
            Converged = summary.Converged && converged,
            ExitReason = summary.ExitReason.And(converged ? ExitCause.Converged : ExitCause.SamplerNotConverged, verdict),
            LogEvidence = lnZ,
            LogEvidenceError = lnZErr,
        }, samples);
    }

    // The kept draws (after burn-in), every walker, thinned by a whole stride to at most MaxKeptDraws rows: θ…, ln p.
    private static double[][] KeptDraws(EnsembleRun run)
    {
        var flat = run.Chain.GetFlatChain(run.BurnIn, run.Thin);
        var lnp = run.Chain.GetFlatLogProbabilities(run.BurnIn, run.Thin);
        int stride = Math.Max(1, (flat.Length + MaxKeptDraws - 1) / MaxKeptDraws);
        var rows = new List<double[]>(flat.Length / stride + 1);
        for (int i = 0; i < flat.Length; i += stride) rows.Add([.. flat[i], lnp[i]]);
        return rows.ToArray();
    }

    private sealed class Progress(IProgress<FitProgress>? sink, string stage) : IProgress<SamplerProgress>
    {
        public void Report(SamplerProgress value)
        {
            if (sink is null) return;
            var words = new List<string>();
            if (value.Tau is { } tau && double.IsFinite(tau)) words.Add(string.Create(System.Globalization.CultureInfo.InvariantCulture, $"τ {tau:0}"));
            if (value.Step > 0 && value.TotalSteps > value.Step)
            {
                double left = value.Elapsed.TotalSeconds / value.Step * (value.TotalSteps - value.Step);
                words.Add(string.Create(System.Globalization.CultureInfo.InvariantCulture, $"about {(left < 90 ? $"{left:0} s" : $"{left / 60:0} min")} left"));
            }
            sink.Report(new FitProgress(stage, value.Step, value.TotalSteps) { Detail = words.Count > 0 ? string.Join(", ", words) : null });
        }
    }
}

using SizeTest.Inference.Sampling;

namespace SizeTest.Inference;

/// <summary>Posterior samples kept for writing (not part of results.json).</summary>
/// <param name="Model">Model name.</param>
/// <param name="Sampler"><c>mcmc</c> or <c>nested</c>.</param>
/// <param name="ParameterNames">Free-parameter names, in column order.</param>
/// <param name="Rows">Nested sampling: the weighted samples (θ…, ln L, ln weight); MCMC: empty (the chain store has it).</param>
public sealed record PosteriorDraws(string Model, string Sampler, IReadOnlyList<string> ParameterNames, IReadOnlyList<double[]> Rows);

/// <summary>
/// Runs the samplers of <c>Inference/Sampling</c> on a fitted hypothesis and folds their results into the
/// model's summary: parameter values become posterior medians with 16th–84th percentile intervals, the fit is
/// converged only when the sampler's diagnostics say so, and the evidence (nested sampling, or the Laplace
/// approximation at the maximum for MCMC) fills <see cref="ModelFitSummary.LogEvidence"/>.
/// </summary>
public static class PosteriorSampling
{
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
        if (d == 0 || request.Sampler == "none") return (summary, null);
        string label = h.Label;
        Func<int, double> p16, p50, p84;
        bool converged;
        string verdict;
        double? lnZ = null, lnZErr = null;
        PosteriorDraws? samples = null;
        if (request.Sampler == "mcmc")
        {
            var scale = Enumerable.Range(0, d).Select(j =>
            {
                double se = fit.StandardError(j);
                var p = h.FreeParameters[j];
                return double.IsFinite(se) && se > 0 ? Math.Min(se, 0.1 * (p.Max - p.Min)) : 1e-3 * (p.Max - p.Min);
            }).ToArray();
            var start = EnsembleSampler.GaussianBall(posterior, fit.Theta, scale, request.Walkers, seed);
            var sampler = new EnsembleSampler(posterior, new EnsembleSamplerOptions
            {
                Walkers = request.Walkers,
                Steps = request.Steps,
                Seed = seed,
                ParameterNames = names,
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
            verdict = $"ensemble MCMC ({request.Walkers} walkers × {request.Steps} steps, acceptance {run.AcceptanceFraction:0.00}): {run.Diagnostics.Verdict.Summary}";
            if (LaplaceEvidence.TryCompute(likelihood, priors, fit.Theta, out var laplace, out var failure))
                lnZ = laplace.LogEvidence;
            else verdict += $"; Laplace evidence not available ({failure})";
            samples = new PosteriorDraws(label, "mcmc", names, []);
        }
        else if (request.Sampler == "nested")
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
            samples = new PosteriorDraws(label, "nested", names,
                ev.WeightedSamples.Select(w => w.Theta.Concat([w.LogLikelihood, w.LogWeight]).ToArray()).ToArray());
        }
        else throw new ArgumentException($"unknown sampler '{request.Sampler}'; use none, mcmc or nested");

        var parameters = summary.Parameters.Select(p =>
        {
            int j = Array.IndexOf(names, p.Name);
            return j < 0 || p.Fixed ? p : p with { Value = p50(j), Lo = p16(j), Hi = p84(j) };
        }).ToArray();
        return (summary with
        {
            Parameters = parameters,
            Converged = summary.Converged && converged,
            ExitReason = summary.ExitReason + "; " + verdict,
            LogEvidence = lnZ,
            LogEvidenceError = lnZErr,
        }, samples);
    }

    private sealed class Progress(IProgress<FitProgress>? sink, string stage) : IProgress<SamplerProgress>
    {
        public void Report(SamplerProgress value) => sink?.Report(new FitProgress(stage, value.Step, value.TotalSteps));
    }
}

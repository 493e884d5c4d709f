using SizeTest.Photometry;

namespace SizeTest.Inference;

/// <summary>The refined fit of one model.</summary>
/// <param name="Best">The global maximum (possibly higher than the multi-start fit's).</param>
/// <param name="Summary">The reported summary with honest intervals and the modes.</param>
/// <param name="Notes">Sentences for the study notes.</param>
public sealed record RefinedFit(MaximumLikelihoodResult Best, ModelFitSummary Summary, IReadOnlyList<string> Notes);

/// <summary>
/// The steps a study runs after a model's multi-start fit and before sampling: the whole-range profile scan for missed
/// maxima (<see cref="ModeSearch"/>), the summary (<see cref="FitSummaries"/>) and the interval check
/// (<see cref="IntervalAssessment"/>).
/// </summary>
public static class ModelFitRefinement
{
    /// <summary>Refines <paramref name="fit"/>; <paramref name="scanPoints"/> = 0 skips the mode search.</summary>
    public static RefinedFit Run(HypothesisLikelihood likelihood, Observables observables, MaximumLikelihoodResult fit,
        int scanPoints = ModeSearch.DefaultGridPoints, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(likelihood);
        var backend = Evaluation.EvaluationBackend.InProcess(observables ?? throw new ArgumentNullException(nameof(observables)));
        return Run(backend, backend.Bind(likelihood.Hypothesis), fit, scanPoints, cancel);
    }

    /// <summary>Refines <paramref name="fit"/> of <paramref name="likelihood"/> (bound on <paramref name="backend"/>), every
    /// refit on the backend; <paramref name="scanPoints"/> = 0 skips the mode search.</summary>
    public static RefinedFit Run(Evaluation.EvaluationBackend backend, Evaluation.RowSumLikelihood likelihood, MaximumLikelihoodResult fit,
        int scanPoints = ModeSearch.DefaultGridPoints, CancellationToken cancel = default, bool posteriorFollows = false)
    {
        ArgumentNullException.ThrowIfNull(backend);
        ArgumentNullException.ThrowIfNull(likelihood);
        ArgumentNullException.ThrowIfNull(fit);
        var search = scanPoints >= 2
            ? ModeSearch.Run(backend, likelihood, fit, scanPoints, cancel)
            : new ModeSearchResult(fit, [fit], new Dictionary<string, ProfileSample[]>());
        var summary = FitSummaries.From(likelihood.Hypothesis, likelihood.ModelObjects >= 0 ? likelihood.ModelObjects : backend.TotalObjects, search.Best,
            weightSum: double.IsNaN(likelihood.InformationWeight) ? backend.TotalWeight : likelihood.InformationWeight);
        if (!double.IsFinite(search.Best.LogLikelihood)) return new RefinedFit(search.Best, summary, []);
        var assessed = IntervalAssessment.Apply(backend, likelihood, search, summary, posteriorFollows);
        return new RefinedFit(search.Best, assessed.Summary, assessed.Notes);
    }

    /// <summary>Marks the free parameters of a sampled summary as posterior intervals (16th–84th percentiles), keeping
    /// the <c>at_bound</c> flags of the maximum.</summary>
    public static ModelFitSummary MarkPosterior(ModelFitSummary sampled)
    {
        ArgumentNullException.ThrowIfNull(sampled);
        return sampled with
        {
            Parameters = sampled.Parameters.Select(p => p.Fixed ? p : p with { IntervalMethod = IntervalMethods.Posterior, Regions = [] }).ToArray(),
        };
    }
}

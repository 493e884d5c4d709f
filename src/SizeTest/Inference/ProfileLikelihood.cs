using SizeTest.Photometry;

namespace SizeTest.Inference;

/// <summary>One point of a profile likelihood.</summary>
/// <param name="Value">The profiled parameter's value.</param>
/// <param name="LogLikelihood">max over the other parameters of ln L.</param>
/// <param name="Converged">Whether that inner fit converged.</param>
public sealed record ProfilePoint(double Value, double LogLikelihood, bool Converged);

/// <summary>A profile likelihood of one parameter of one model, with its 68% interval where ln L drops by ½ from the maximum.</summary>
/// <param name="Model">Model name.</param>
/// <param name="Parameter">Profiled parameter.</param>
/// <param name="Points">The curve, ascending in value.</param>
/// <param name="Lo">Lower end of the Δ ln L = ½ interval (the lower bound when the profile stays above the level down to it).</param>
/// <param name="Hi">Upper end (likewise).</param>
public sealed record ProfileLikelihoodResult(string Model, string Parameter, IReadOnlyList<ProfilePoint> Points, double Lo, double Hi);

/// <summary>Profile likelihood: fix one parameter on a grid, maximise over the others (Wilks 1938: Δ ln L = ½ ↔ 68%).</summary>
public static class ProfileLikelihood
{
    /// <summary>
    /// Profiles <paramref name="parameter"/> over its whole bounded range: <paramref name="points"/> values spanning the
    /// bounds (evenly, or evenly in ln for a positive range wider than a factor 100) plus 21 values over ±3σ of the
    /// maximum, each refit warm-started from its neighbour, then the outermost Δ ln L = ½ crossings refined by bisection
    /// (<see cref="ProfileInterval"/>). With several maxima the interval is the hull of the Δ ln L ≤ ½ region.
    /// </summary>
    public static ProfileLikelihoodResult Run(Hypothesis hypothesis, Observables observables, MaximumLikelihoodResult best, string parameter, int points = ModeSearch.DefaultGridPoints)
    {
        ArgumentNullException.ThrowIfNull(observables);
        return Run(Evaluation.EvaluationBackend.InProcess(observables), hypothesis, best, parameter, points);
    }

    /// <summary>As <see cref="Run(Hypothesis, Observables, MaximumLikelihoodResult, string, int)"/> with every refit on
    /// <paramref name="backend"/> (threads, or MPI ranks).</summary>
    public static ProfileLikelihoodResult Run(Evaluation.EvaluationBackend backend, Hypothesis hypothesis, MaximumLikelihoodResult best, string parameter, int points = ModeSearch.DefaultGridPoints)
    {
        ArgumentNullException.ThrowIfNull(backend);
        ArgumentNullException.ThrowIfNull(hypothesis);
        ArgumentNullException.ThrowIfNull(best);
        var refit = new ProfileRefit(backend, hypothesis, parameter) { Covariance = best.Covariance };
        int j = refit.Index;
        double se = best.StandardError(j);
        double range = refit.Max - refit.Min;
        if (!double.IsFinite(se) || se <= 0) se = 0.05 * range;
        double lo = Math.Max(refit.Min, best.Theta[j] - 3 * se), hi = Math.Min(refit.Max, best.Theta[j] + 3 * se);
        var grid = ProfileRefit.WholeRangeGrid(refit.Min, refit.Max, Math.Max(2, points))
            .Concat(Enumerable.Range(0, 21).Select(i => lo + (hi - lo) * i / 20))
            .Distinct().Order().ToArray();
        var scan = refit.Sweep(grid, best.Theta);
        double top = ProfileRefit.Penalised(hypothesis, best.Theta, best.LogLikelihood);
        var samples = scan.Append(new ProfileSample(best.Theta[j], top, best.LogLikelihood, best.Theta, best.Converged));
        var cr = ProfileInterval.Find(refit, samples, se, top);
        var curve = cr.Samples.Select(p => new ProfilePoint(p.Value, p.LogLikelihood, p.Converged)).ToArray();
        return new ProfileLikelihoodResult(hypothesis.Label, parameter, curve, cr.Lo, cr.Hi);
    }
}

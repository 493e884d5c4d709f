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
/// <param name="Lo">Lower end of the Δ ln L = ½ interval (NaN when the curve does not reach it).</param>
/// <param name="Hi">Upper end.</param>
public sealed record ProfileLikelihoodResult(string Model, string Parameter, IReadOnlyList<ProfilePoint> Points, double Lo, double Hi);

/// <summary>Profile likelihood: fix one parameter on a grid, maximise over the others (Wilks 1938: Δ ln L = ½ ↔ 68%).</summary>
public static class ProfileLikelihood
{
    /// <summary>Profiles <paramref name="parameter"/> on <paramref name="points"/> values spanning ±3σ around the best fit.</summary>
    public static ProfileLikelihoodResult Run(Hypothesis hypothesis, Observables observables, MaximumLikelihoodResult best, string parameter, int points = 21)
    {
        ArgumentNullException.ThrowIfNull(observables);
        return Run(Evaluation.EvaluationBackend.InProcess(observables), hypothesis, best, parameter, points);
    }

    /// <summary>As <see cref="Run(Hypothesis, Observables, MaximumLikelihoodResult, string, int)"/> on <paramref name="backend"/>
    /// (profile points concurrently in one process, in order under MPI).</summary>
    public static ProfileLikelihoodResult Run(Evaluation.EvaluationBackend backend, Hypothesis hypothesis, MaximumLikelihoodResult best, string parameter, int points = 21)
    {
        ArgumentNullException.ThrowIfNull(backend);
        ArgumentNullException.ThrowIfNull(hypothesis);
        ArgumentNullException.ThrowIfNull(best);
        int j = hypothesis.FreeParameters.ToList().FindIndex(p => p.Name == parameter);
        if (j < 0) throw new ArgumentException($"parameter '{parameter}' is not free in model '{hypothesis.Label}', so it cannot be profiled");
        var spec = hypothesis.FreeParameters[j];
        double se = best.StandardError(j);
        if (!double.IsFinite(se) || se <= 0) se = 0.05 * (spec.Max - spec.Min);
        double lo = Math.Max(spec.Min, best.Theta[j] - 3 * se), hi = Math.Min(spec.Max, best.Theta[j] + 3 * se);
        var values = Enumerable.Range(0, points).Select(i => lo + (hi - lo) * i / (points - 1)).ToArray();
        var result = new ProfilePoint[points];
        backend.ForEach(points, i =>
        {
            var h = hypothesis.WithFixed(parameter, values[i]);
            var lik = backend.Bind(h);
            var start = best.Theta.Where((_, k) => k != j).ToArray();
            var fit = MaximumLikelihood.Fit(lik, lik.Posterior, h.FreeParameters, start, new OptimizerSettings(Starts: 1), covariance: false);
            result[i] = new ProfilePoint(values[i], fit.LogLikelihood, fit.Converged);
        });
        double top = Math.Max(best.LogLikelihood, result.Max(p => p.LogLikelihood));
        double Crossing(IEnumerable<int> order)
        {
            int? prev = null;
            foreach (var i in order)
            {
                if (prev is { } p && result[p].LogLikelihood >= top - 0.5 && result[i].LogLikelihood < top - 0.5)
                {
                    double f = (result[p].LogLikelihood - (top - 0.5)) / (result[p].LogLikelihood - result[i].LogLikelihood);
                    return values[p] + f * (values[i] - values[p]);
                }
                prev = i;
            }
            return double.NaN;
        }
        int peak = Array.FindIndex(values, v => v >= best.Theta[j]);
        if (peak < 0) peak = points - 1;
        return new ProfileLikelihoodResult(hypothesis.Label, parameter, result,
            Crossing(Enumerable.Range(0, peak + 1).Reverse()), Crossing(Enumerable.Range(peak, points - peak)));
    }
}

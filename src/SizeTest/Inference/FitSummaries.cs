using SizeTest.Inference.Comparison;

namespace SizeTest.Inference;

/// <summary>Turns a maximum-likelihood fit into the reported <see cref="ModelFitSummary"/>.</summary>
public static class FitSummaries
{
    /// <summary>
    /// Every parameter with its value and 68% interval (Hessian ±1σ, clipped to the bounds, <c>interval_method</c>
    /// hessian; a parameter whose maximum is on a bound is flagged <c>at_bound</c> and its interval starts at that bound;
    /// fixed parameters have lo = hi = value and method <c>fixed</c>; <see cref="IntervalAssessment"/> replaces
    /// intervals by profile ones where needed), ln L̂, k, n and AIC, AICc, BIC. Comparison fields are filled by <see cref="ModelComparison.Rank"/>.
    /// </summary>
    public static ModelFitSummary From(HypothesisLikelihood likelihood, MaximumLikelihoodResult fit, string? name = null)
    {
        ArgumentNullException.ThrowIfNull(likelihood);
        return From(likelihood.Hypothesis, likelihood.Count, fit, name);
    }

    /// <summary>As <see cref="From(HypothesisLikelihood, MaximumLikelihoodResult, string?)"/> for hypothesis <paramref name="h"/>
    /// fitted to <paramref name="objects"/> objects (e.g. a sample spread over MPI ranks) whose weights sum to
    /// <paramref name="weightSum"/> (null: every weight is 1), the n of AICc and BIC (<see cref="InformationCriteria"/>).</summary>
    public static ModelFitSummary From(Hypothesis h, int objects, MaximumLikelihoodResult fit, string? name = null, double? weightSum = null)
    {
        ArgumentNullException.ThrowIfNull(h);
        ArgumentNullException.ThrowIfNull(fit);
        var values = h.FullValues(fit.Theta);
        var list = new List<ParameterEstimate>();
        int j = 0;
        for (int i = 0; i < h.Parameters.Count; i++)
        {
            var p = h.Parameters[i];
            if (!p.IsFree)
            {
                // A "not given" default (NaN, e.g. omega_lambda = flat) is reported as the value the model derived.
                double fixedValue = double.IsNaN(p.Value) ? DerivedValue(h, values, p.Name) : p.Value;
                list.Add(new ParameterEstimate(p.Name, fixedValue, fixedValue, fixedValue, true, p.Spec.Unit, IntervalMethods.Fixed));
                continue;
            }
            double se = fit.StandardError(j);
            double v = values[i];
            double lo = double.IsFinite(se) ? Math.Max(p.Min, v - se) : double.NaN;
            double hi = double.IsFinite(se) ? Math.Min(p.Max, v + se) : double.NaN;
            string? atBound = null;
            if (fit.AtBound[j])
            {
                atBound = v - p.Min <= p.Max - v ? "lower" : "upper";
                if (atBound == "lower") lo = p.Min; else hi = p.Max;
            }
            list.Add(new ParameterEstimate(p.Name, v, lo, hi, false, p.Spec.Unit, IntervalMethods.Hessian, atBound));
            j++;
        }
        int k = h.K, n = objects;
        double nInformation = weightSum ?? objects;
        return new ModelFitSummary
        {
            Name = name ?? h.Label,
            Parameters = list,
            FluxConvention = FluxConventionOf(h, values),
            LogLikelihood = fit.LogLikelihood,
            K = k,
            N = n,
            Aic = InformationCriteria.Aic(fit.LogLikelihood, k),
            Aicc = InformationCriteria.Aicc(fit.LogLikelihood, k, nInformation),
            Bic = InformationCriteria.Bic(fit.LogLikelihood, k, nInformation),
            Converged = fit.Converged,
            ExitReason = fit.ExitReason,
        };
    }

    /// <summary>The label of a static model's flux convention (<see cref="Cosmology.FluxConventions.Label"/>), null for other models.</summary>
    internal static string? FluxConventionOf(Hypothesis h, double[] values)
    {
        if (!Cosmology.FluxConventions.Applies(h.Family)) return null;
        for (int i = 0; i < h.Parameters.Count; i++)
            if (h.Parameters[i].Name == Cosmology.WorldModelParameters.Names.LuminosityExponent)
                return Cosmology.FluxConventions.Label(values[i], h.Parameters[i].IsFree);
        return null;
    }

    /// <summary>The value a world model derived for a parameter left "not given" (NaN), or NaN if it defines none.</summary>
    internal static double DerivedValue(Hypothesis h, double[] values, string name)
    {
        var given = new Dictionary<string, double>(StringComparer.Ordinal);
        var specs = h.Family.Parameters.Select(s => s.Name).ToHashSet(StringComparer.Ordinal);
        for (int i = 0; i < h.Parameters.Count; i++)
            if (specs.Contains(h.Parameters[i].Name) && !double.IsNaN(values[i])) given[h.Parameters[i].Name] = values[i];
        return h.Family.TryCreate(given, out var model, out _) && model!.ParameterValues.TryGetValue(name, out var v) ? v : double.NaN;
    }
}

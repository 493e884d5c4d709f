using SizeTest.Foundation.Errors;

namespace SizeTest.Inference;

/// <summary>
/// Whether a sample can identify a model's free parameters: a fit needs more objects than free parameters (k &lt; n;
/// with k ≥ n the maximum is not unique and AICc is undefined), and asymptotic intervals and criteria want about
/// ten objects per free parameter (a common rule of thumb, e.g. Harrell 2015, §4.4 [from memory]).
/// </summary>
public static class SampleSizeCheck
{
    /// <summary>Objects per free parameter below which the study warns.</summary>
    public const int ObjectsPerParameter = 10;

    /// <summary>Throws <see cref="InputException"/> (exit 2) naming the model and the counts when some hypothesis has k ≥ n.</summary>
    public static void RefuseUnidentifiable(IEnumerable<Hypothesis> hypotheses, int objects)
    {
        ArgumentNullException.ThrowIfNull(hypotheses);
        foreach (var h in hypotheses)
            if (h.K >= objects)
                throw new InputException($"model '{h.Label}' has k = {h.K} free parameters but the sample has only n = {objects} object{(objects == 1 ? "" : "s")}; a fit needs more objects than free parameters (fix some parameters or add objects)");
    }

    /// <summary>
    /// Throws <see cref="InputException"/> (exit 2) when a population of <paramref name="groupLabels"/> (one label per object, <c>--group</c>)
    /// has no more objects than its own free parameters (<c>NAME@GROUP</c>: R0, a, β, scatter …): its parameters are not identified
    /// and the whole fit would fail to converge, taking the shared world model with it (review: a one-object group gave exit 1 and
    /// "a[solo] = −2 +8 −4").
    /// </summary>
    public static void RefuseSmallGroups(IEnumerable<Hypothesis> hypotheses, IReadOnlyList<string>? groupLabels)
    {
        ArgumentNullException.ThrowIfNull(hypotheses);
        if (groupLabels is null || groupLabels.Count == 0) return;
        var counts = groupLabels.GroupBy(g => g, StringComparer.Ordinal).ToDictionary(g => g.Key, g => g.Count(), StringComparer.Ordinal);
        foreach (var h in hypotheses)
            foreach (var (label, n) in counts.OrderBy(kv => kv.Value).ThenBy(kv => kv.Key, StringComparer.Ordinal))
            {
                int k = h.FreeParameters.Count(p => Comparison.EvolutionTestTable.GroupOf(p.Name) == label);
                if (k > 0 && n <= k)
                    throw SettingProblem.Input($"population '{label}' of the {{group}} column has {n} object{(n == 1 ? "" : "s")} but {k} parameters of its own in model '{h.Label}' " +
                        $"({string.Join(", ", h.FreeParameters.Where(p => Comparison.EvolutionTestTable.GroupOf(p.Name) == label).Select(p => p.Name))}); each population needs more objects than its parameters: merge or drop it");
            }
    }

    /// <summary>A warning for the study notes when some model has fewer than <see cref="ObjectsPerParameter"/> objects per
    /// free parameter, or null.</summary>
    public static string? Warning(IEnumerable<Hypothesis> hypotheses, int objects)
    {
        ArgumentNullException.ThrowIfNull(hypotheses);
        int k = hypotheses.Select(h => h.K).DefaultIfEmpty(0).Max();
        return k > 0 && objects < ObjectsPerParameter * k
            ? $"warning: n = {objects} objects for up to k = {k} free parameters is fewer than {ObjectsPerParameter} per parameter; intervals, information criteria and Bayes factors rest on large-sample approximations and may be unreliable"
            : null;
    }
}

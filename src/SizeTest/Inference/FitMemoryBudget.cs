using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Files;

namespace SizeTest.Inference;

/// <summary>
/// The memory a fit's own structures need, estimated from the settings before anything is allocated, and refused
/// through <see cref="ResourceBudget"/> when it exceeds the machine's available memory or the user's limit.
/// Shared by <c>fit</c> and study files (<c>run</c>), so a setting too large fails the same way wherever it is given.
/// </summary>
/// <remarks>
/// Estimates, in 8-byte doubles: MCMC chains walkers × steps × (k + 1) per model (positions and ln p), kept twice
/// (chain and thinned samples); bootstrap resamples × (k + 4) per model; optimiser starts × (k + 1) × 24 (L-BFGS
/// history of 10 pairs and work vectors); nested sampling live points × (k + 1) × 64 (live set plus the dead points
/// of a typical run).
/// </remarks>
public static class FitMemoryBudget
{
    /// <summary>Refuses (an <see cref="InputException"/>, exit 2, with the estimate) settings whose structures would not fit.</summary>
    /// <param name="hypotheses">The models to fit (k is the largest number of free parameters).</param>
    /// <param name="sampler">The sampler that will run.</param>
    /// <param name="walkers">Ensemble walkers.</param>
    /// <param name="steps">Steps per walker (the most that will be run).</param>
    /// <param name="livePoints">Nested-sampling live points.</param>
    /// <param name="bootstrap">Bootstrap resamples.</param>
    /// <param name="starts">Optimiser starts.</param>
    /// <param name="limitBytes">The user's memory limit, or null.</param>
    public static void Check(IReadOnlyList<Hypothesis> hypotheses, SamplerKind sampler, int walkers, int steps, int livePoints, int bootstrap, int starts, long? limitBytes)
    {
        ArgumentNullException.ThrowIfNull(hypotheses);
        double k = hypotheses.Count == 0 ? 1 : hypotheses.Max(h => h.K), models = hypotheses.Count;
        if (sampler == SamplerKind.Mcmc) ResourceBudget.Check($"the MCMC chains ({walkers} walkers × {steps} steps × {k} parameters × {models} models)", 2.0 * 8 * walkers * (double)steps * (k + 1) * models, limitBytes);
        if (sampler == SamplerKind.Nested) ResourceBudget.Check($"nested sampling ({livePoints} live points)", 8.0 * 64 * livePoints * (k + 1) * models, limitBytes);
        ResourceBudget.Check($"the bootstrap ({bootstrap} resamples)", 8.0 * bootstrap * (k + 4) * models, limitBytes);
        ResourceBudget.Check($"the optimiser starts ({starts} starts)", 8.0 * 24 * starts * (k + 1) * models, limitBytes);
    }
}

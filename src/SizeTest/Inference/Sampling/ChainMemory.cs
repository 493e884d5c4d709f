using System.Globalization;

namespace SizeTest.Inference.Sampling;

/// <summary>
/// The memory bound of an MCMC chain store: it grows in blocks as the run is extended but never beyond
/// walkers × max steps × (parameters + 1) × 8 B (positions and ln p, doubles), which is checked before sampling.
/// </summary>
public static class ChainMemory
{
    /// <summary>Default <c>--max-steps</c>: the most steps per walker of a run to convergence.</summary>
    public const int DefaultMaxSteps = 50_000;

    /// <summary>Default budget for one chain store: 2 GiB.</summary>
    public const long DefaultBudgetBytes = 2L << 30;

    /// <summary>Steps of the first block of a run to convergence (the run then grows towards 50 τ).</summary>
    public const int FirstBlockSteps = 1000;

    /// <summary>Bytes a chain of <paramref name="walkers"/> × <paramref name="steps"/> × <paramref name="dimension"/> can hold.</summary>
    public static long Bytes(int walkers, int steps, int dimension) => (long)walkers * steps * (dimension + 1) * sizeof(double);

    /// <summary>Throws <see cref="SizeTest.Foundation.Errors.InputException"/> (exit 2) when the largest chain would exceed <paramref name="budgetBytes"/>.</summary>
    public static void Check(int walkers, int maxSteps, int dimension, long budgetBytes)
    {
        long bytes = Bytes(walkers, maxSteps, dimension);
        if (bytes > budgetBytes)
            throw SizeTest.Foundation.Errors.SettingProblem.Input(string.Create(CultureInfo.InvariantCulture,
                $"the MCMC chain could need {walkers} walkers × {maxSteps} steps × ({dimension} parameters + ln p) × 8 B = {bytes / 1048576.0:0} MiB, more than the budget of {budgetBytes / 1048576.0:0} MiB; lower {{max_steps}} or {{walkers}}"));
    }
}

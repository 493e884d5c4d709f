using System.CommandLine;
using SizeTest.Foundation.Files;

namespace SizeTest.Cli;

/// <summary>
/// <c>--force</c> (replace an output folder sizetest wrote) and <c>--max-memory SIZE</c> (refuse work whose
/// estimated memory is above it), shared by <c>fit</c> (also under mpirun), <c>power</c> and <c>run</c>.
/// </summary>
/// <param name="forceDescription">The verb's help for <c>--force</c>.</param>
/// <param name="memoryWork">What the verb refuses and what its estimate counts, e.g. "a fit whose estimated memory (chains, resamples, starts, live points)".</param>
internal sealed class OutputLimitOptions(string forceDescription, string memoryWork)
{
    /// <summary><c>--force</c>.</summary>
    public Option<bool> Force { get; } = new("--force") { Description = forceDescription };

    /// <summary><c>--max-memory SIZE</c>.</summary>
    public Option<string?> MaxMemory { get; } = new("--max-memory") { Description = $"Refuse {memoryWork} is above this size (e.g. 4G); the machine's available memory is always a limit." };

    /// <summary>Whether an existing output folder may be replaced.</summary>
    public bool Replace(ParseResult parse) => parse.GetValue(Force);

    /// <summary>The memory limit in bytes, or null when none is given.</summary>
    public long? MemoryLimit(ParseResult parse) => parse.GetValue(MaxMemory) is { } text ? ResourceBudget.ParseSize(text) : null;
}

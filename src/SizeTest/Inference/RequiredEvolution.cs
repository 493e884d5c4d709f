using SizeTest.Inference.Comparison;

namespace SizeTest.Inference;

/// <summary>An expected range for a parameter given by the user (e.g. passive-evolution expectations for size_evolution).</summary>
/// <param name="Parameter">Parameter name.</param>
/// <param name="Lo">Lower end.</param>
/// <param name="Hi">Upper end.</param>
public sealed record ExpectedRange(string Parameter, double Lo, double Hi);

/// <summary>
/// How much evolution a world model needs to fit: the fitted evolution exponent with its 68% interval, whether
/// zero evolution is excluded (likelihood-ratio test against the same model with the exponent fixed at 0), and how
/// it compares with an expected range.
/// </summary>
/// <param name="Model">Model name.</param>
/// <param name="Parameter"><c>size_evolution</c> or <c>sb_evolution</c>.</param>
/// <param name="Value">Fitted value.</param>
/// <param name="Lo">Lower end of the 68% interval.</param>
/// <param name="Hi">Upper end of the 68% interval.</param>
/// <param name="Fixed">True when the exponent was held fixed (nothing was inferred).</param>
/// <param name="ZeroExcluded">True when the LRT rejects zero evolution at p &lt; 0.05.</param>
/// <param name="PValue">LRT p-value for zero evolution, when run.</param>
/// <param name="Sigma">Gaussian-equivalent significance of <paramref name="PValue"/>.</param>
/// <param name="ExpectedLo">Lower end of the expected range, when given.</param>
/// <param name="ExpectedHi">Upper end of the expected range, when given.</param>
/// <param name="Verdict">One sentence for people.</param>
public sealed record RequiredEvolution(string Model, string Parameter, double Value, double Lo, double Hi, bool Fixed,
    bool ZeroExcluded, double? PValue, double? Sigma, double? ExpectedLo, double? ExpectedHi, string Verdict)
{
    /// <summary>The population of a per-group exponent (<c>size_evolution@early</c> → <c>early</c>; <c>--group</c>), or null for the whole sample.</summary>
    public string? Group => Comparison.EvolutionTestTable.GroupOf(Parameter);

    /// <summary>Builds the statement from a fitted estimate, its LRT (if any) and an expected range (if any).</summary>
    /// <param name="model">The model's label.</param>
    /// <param name="estimate">The evolution parameter's estimate.</param>
    /// <param name="lrt">Its likelihood-ratio test against 0, if run.</param>
    /// <param name="expected">The study's expected range, if given.</param>
    /// <param name="sbAtFixedLuminosity">b is the SB change at fixed luminosity (<see cref="Comparison.EvolutionExpectation.InForce"/>).</param>
    /// <param name="compactRadioSources">The objects are compact radio sources: the shipped galaxy expectations do not apply.</param>
    public static RequiredEvolution Assess(string model, ParameterEstimate estimate, LikelihoodRatioTest? lrt, ExpectedRange? expected, bool sbAtFixedLuminosity = false, bool compactRadioSources = false)
    {
        ArgumentNullException.ThrowIfNull(estimate);
        var inv = System.Globalization.CultureInfo.InvariantCulture;
        string baseName = Comparison.EvolutionTestTable.BaseName(estimate.Name);
        string what = (baseName == NuisanceParameters.Names.SizeEvolution ? "size evolution (1+z)^a" : "surface-brightness evolution b")
                      + (Comparison.EvolutionTestTable.GroupOf(estimate.Name) is { } group ? $" of group {group}" : "");
        if (estimate.Fixed)
            return new RequiredEvolution(model, estimate.Name, estimate.Value, estimate.Value, estimate.Value, true, false, null, null,
                expected?.Lo, expected?.Hi, $"{model}: {what} held fixed at {estimate.Value.ToString("0.###", inv)}");
        bool excluded = lrt is not null && lrt.PValue < Comparison.EvolutionTestTable.Alpha;
        // The same words as the report and the CLI (one statement per test, Comparison.EvolutionTestTable).
        var exp = Comparison.EvolutionExpectation.InForce(expected is null ? [] : [expected], sbAtFixedLuminosity, compactRadioSources).FirstOrDefault(e => e.Parameter == baseName);
        var row = new Comparison.EvolutionTestRow(model, estimate.Name, estimate.Value, estimate.Lo, estimate.Hi, lrt?.PValue,
            lrt is null ? Comparison.EvolutionNeed.NotTested : excluded ? Comparison.EvolutionNeed.Needed : Comparison.EvolutionNeed.NotNeeded,
            exp?.Judge(estimate.Value, estimate.Lo, estimate.Hi) ?? Comparison.Plausibility.NotJudged, exp);
        var parts = new List<string> { Comparison.EvolutionTestTable.Statement(row).TrimEnd('.') };
        if (Comparison.EvolutionTestTable.CallOut(row) is { } callout) parts.Add(callout.TrimEnd('.'));
        return new RequiredEvolution(model, estimate.Name, estimate.Value, estimate.Lo, estimate.Hi, false, excluded,
            lrt?.PValue, lrt?.Sigma, expected?.Lo, expected?.Hi, string.Join(". ", parts) + ".");
    }
}

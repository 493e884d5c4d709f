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
    /// <summary>Builds the statement from a fitted estimate, its LRT (if any) and an expected range (if any).</summary>
    public static RequiredEvolution Assess(string model, ParameterEstimate estimate, LikelihoodRatioTest? lrt, ExpectedRange? expected)
    {
        ArgumentNullException.ThrowIfNull(estimate);
        var inv = System.Globalization.CultureInfo.InvariantCulture;
        string what = estimate.Name == "size_evolution" ? "size evolution (1+z)^a" : "surface-brightness evolution b";
        if (estimate.Fixed)
            return new RequiredEvolution(model, estimate.Name, estimate.Value, estimate.Value, estimate.Value, true, false, null, null,
                expected?.Lo, expected?.Hi, $"{model}: {what} held fixed at {estimate.Value.ToString("0.###", inv)}");
        bool excluded = lrt is not null && lrt.PValue < 0.05;
        var parts = new List<string>
        {
            $"{model} needs {what} = {estimate.Value.ToString("0.000", inv)} (68%: {estimate.Lo.ToString("0.000", inv)} … {estimate.Hi.ToString("0.000", inv)})",
        };
        if (lrt is not null)
            parts.Add(excluded ? $"zero evolution excluded at {lrt.Sigma.ToString("0.0", inv)}σ ({LikelihoodRatioTest.FormatPValue(lrt.PValue)})"
                               : $"zero evolution not excluded (p = {lrt.PValue.ToString("0.000", inv)})");
        if (expected is not null)
        {
            string rel = estimate.Hi < expected.Lo ? "below the expected range"
                : estimate.Lo > expected.Hi ? "above the expected range"
                : "consistent with the expected range";
            parts.Add($"{rel} [{expected.Lo.ToString("0.###", inv)}, {expected.Hi.ToString("0.###", inv)}]");
        }
        return new RequiredEvolution(model, estimate.Name, estimate.Value, estimate.Lo, estimate.Hi, false, excluded,
            lrt?.PValue, lrt?.Sigma, expected?.Lo, expected?.Hi, string.Join("; ", parts));
    }
}

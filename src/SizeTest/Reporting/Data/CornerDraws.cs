
namespace SizeTest.Reporting.Data;

/// <summary>Posterior samples of one model for a corner plot (flattened chain after burn-in).</summary>
/// <param name="Model">Model name.</param>
/// <param name="Parameters">Parameter names, one per column.</param>
/// <param name="Units">Unit per parameter ("dimensionless" for pure numbers).</param>
/// <param name="Samples">Samples as rows: Samples[i][j] is parameter j of sample i.</param>
public sealed record CornerDraws(string Model, IReadOnlyList<string> Parameters, IReadOnlyList<string> Units, IReadOnlyList<double[]> Samples);

namespace SizeTest.Reporting.Figures;

/// <summary>A 1-D histogram: bin edges (n+1) and counts or densities (n), drawn as an outlined step.</summary>
/// <param name="Label">Legend text, or empty.</param>
/// <param name="Edges">Bin edges, increasing, length n+1.</param>
/// <param name="Heights">Height per bin, length n.</param>
public sealed record HistogramSeries(string Label, IReadOnlyList<double> Edges, IReadOnlyList<double> Heights) : SeriesSpec(Label)
{
    /// <summary>Whether the bars are filled (with <see cref="SeriesSpec.Alpha"/>) as well as outlined.</summary>
    public bool Filled { get; init; } = true;

    /// <inheritdoc />
    public override IEnumerable<double> XExtent() => Edges;
    /// <inheritdoc />
    public override IEnumerable<double> YExtent() => Heights.Append(0.0);
}

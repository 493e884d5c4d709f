namespace SizeTest.Reporting.Figures;

/// <summary>
/// Binned statistics: per bin a value (median or mean) with its interval (bounds, not lengths,
/// e.g. bootstrap 16th–84th percentiles), drawn at the bin centre with a horizontal bar over
/// the bin.
/// </summary>
/// <param name="Label">Legend text, or empty.</param>
/// <param name="XLow">Lower bin edges.</param>
/// <param name="XHigh">Upper bin edges.</param>
/// <param name="Y">Statistic per bin.</param>
/// <param name="YLow">Lower bound of its interval.</param>
/// <param name="YHigh">Upper bound of its interval.</param>
public sealed record BinnedSeries(string Label, IReadOnlyList<double> XLow, IReadOnlyList<double> XHigh,
    IReadOnlyList<double> Y, IReadOnlyList<double> YLow, IReadOnlyList<double> YHigh) : SeriesSpec(Label)
{
    /// <summary>Where each point is drawn on x (e.g. the median redshift of its bin); null: the bin centre.</summary>
    public IReadOnlyList<double>? XCentre { get; init; }

    /// <summary>Marker shape.</summary>
    public MarkerKind Marker { get; init; } = MarkerKind.Square;
    /// <summary>Marker size in points.</summary>
    public double MarkerSize { get; init; } = 6;

    /// <inheritdoc />
    public override IEnumerable<double> XExtent() => XLow.Concat(XHigh);
    /// <inheritdoc />
    public override IEnumerable<double> YExtent() => Y.Concat(YLow).Concat(YHigh);
}

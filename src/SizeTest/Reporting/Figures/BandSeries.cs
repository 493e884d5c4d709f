namespace SizeTest.Reporting.Figures;

/// <summary>A filled band between two curves (e.g. a 68% interval of a prediction or a power curve).</summary>
/// <param name="Label">Legend text, or empty.</param>
/// <param name="X">x values, increasing.</param>
/// <param name="Low">Lower edge per x.</param>
/// <param name="High">Upper edge per x.</param>
public sealed record BandSeries(string Label, IReadOnlyList<double> X, IReadOnlyList<double> Low, IReadOnlyList<double> High) : SeriesSpec(Label)
{
    /// <inheritdoc />
    public override IEnumerable<double> XExtent() => X;
    /// <inheritdoc />
    public override IEnumerable<double> YExtent() => Low.Concat(High);
}

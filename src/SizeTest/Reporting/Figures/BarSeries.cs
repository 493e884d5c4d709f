namespace SizeTest.Reporting.Figures;

/// <summary>
/// Bars on a categorical axis: bar i sits at category coordinate i (see
/// <see cref="AxisSpec.Categories"/>) with length <c>Values[i]</c>. Horizontal bars put the
/// categories on the y axis.
/// </summary>
/// <param name="Label">Legend text, or empty.</param>
/// <param name="Values">Bar lengths.</param>
public sealed record BarSeries(string Label, IReadOnlyList<double> Values) : SeriesSpec(Label)
{
    /// <summary>Categories on the y axis, bars extend along x.</summary>
    public bool Horizontal { get; init; }
    /// <summary>Offset of the bars from the category coordinate (to place two bar series side by side).</summary>
    public double Offset { get; init; }
    /// <summary>Bar thickness in category units (≤ 1).</summary>
    public double Thickness { get; init; } = 0.7;

    /// <inheritdoc />
    public override IEnumerable<double> XExtent() => Horizontal ? Values.Append(0.0) : Positions();
    /// <inheritdoc />
    public override IEnumerable<double> YExtent() => Horizontal ? Positions() : Values.Append(0.0);

    private IEnumerable<double> Positions() =>
        Enumerable.Range(0, Values.Count).SelectMany(i => new[] { i + Offset - Thickness / 2, i + Offset + Thickness / 2 });
}

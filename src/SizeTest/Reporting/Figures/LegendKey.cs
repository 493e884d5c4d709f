namespace SizeTest.Reporting.Figures;

/// <summary>
/// A legend entry that draws nothing in the panel: explains a line style shared by several
/// series (e.g. "dashed: same model without evolution") so the legend stays short.
/// </summary>
/// <param name="Label">Legend text.</param>
public sealed record LegendKey(string Label) : SeriesSpec(Label)
{
    /// <summary>Dash pattern shown in the legend.</summary>
    public DashKind Dash { get; init; } = DashKind.Dashed;

    /// <inheritdoc />
    public override IEnumerable<double> XExtent() => [];
    /// <inheritdoc />
    public override IEnumerable<double> YExtent() => [];
}

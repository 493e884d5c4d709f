namespace SizeTest.Reporting.Figures;

/// <summary>A horizontal or vertical line across the panel at a fixed data value (e.g. zero residual, a ΔBIC threshold, a true value).</summary>
/// <param name="Label">Legend text, or empty.</param>
/// <param name="Value">Position in data units.</param>
/// <param name="Vertical">True for a vertical line at x = Value; false for horizontal at y = Value.</param>
public sealed record ReferenceLine(string Label, double Value, bool Vertical) : SeriesSpec(Label)
{
    /// <summary>Dash pattern.</summary>
    public DashKind Dash { get; init; } = DashKind.Dotted;

    /// <inheritdoc />
    public override IEnumerable<double> XExtent() => Vertical ? [Value] : [];
    /// <inheritdoc />
    public override IEnumerable<double> YExtent() => Vertical ? [] : [Value];
}

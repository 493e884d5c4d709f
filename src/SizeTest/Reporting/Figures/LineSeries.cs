namespace SizeTest.Reporting.Figures;

/// <summary>A polyline through (x, y): a model curve or a reference curve.</summary>
/// <param name="Label">Legend text, or empty.</param>
/// <param name="X">x values, increasing.</param>
/// <param name="Y">y values, same length.</param>
public sealed record LineSeries(string Label, IReadOnlyList<double> X, IReadOnlyList<double> Y) : SeriesSpec(Label)
{
    /// <summary>Dash pattern.</summary>
    public DashKind Dash { get; init; } = DashKind.Solid;
    /// <summary>Line width in points.</summary>
    public double Width { get; init; } = 1.5;

    /// <inheritdoc />
    public override IEnumerable<double> XExtent() => X;
    /// <inheritdoc />
    public override IEnumerable<double> YExtent() => Y;
}

/// <summary>Line dash patterns.</summary>
public enum DashKind
{
    /// <summary>Continuous.</summary>
    Solid,
    /// <summary>Long dashes.</summary>
    Dashed,
    /// <summary>Dots.</summary>
    Dotted,
    /// <summary>Dash-dot.</summary>
    DashDot,
}

namespace SizeTest.Reporting.Figures;

/// <summary>One set of axes in a figure: two axes, the series drawn on them and a legend position.</summary>
public sealed record PanelSpec
{
    /// <summary>Horizontal axis.</summary>
    public required AxisSpec X { get; init; }

    /// <summary>Vertical axis.</summary>
    public required AxisSpec Y { get; init; }

    /// <summary>Series in drawing order (first drawn first, i.e. underneath).</summary>
    public required IReadOnlyList<SeriesSpec> Series { get; init; }

    /// <summary>0-based grid row.</summary>
    public int Row { get; init; }

    /// <summary>0-based grid column.</summary>
    public int Column { get; init; }

    /// <summary>Where the legend goes; <see cref="LegendPlace.None"/> hides it.</summary>
    public LegendPlace Legend { get; init; } = LegendPlace.UpperRight;

    /// <summary>Whether the horizontal axis shows tick labels and its title (false for a panel stacked above another sharing x).</summary>
    public bool XAxisLabelled { get; init; } = true;

    /// <summary>Whether the vertical axis shows tick labels and its title.</summary>
    public bool YAxisLabelled { get; init; } = true;

    /// <summary>Short text drawn in the panel's upper-left corner (e.g. "residuals"), or empty.</summary>
    public string Note { get; init; } = "";
}

/// <summary>Legend position inside a panel.</summary>
public enum LegendPlace
{
    /// <summary>No legend.</summary>
    None,
    /// <summary>Upper right corner.</summary>
    UpperRight,
    /// <summary>Upper left corner.</summary>
    UpperLeft,
    /// <summary>Lower left corner.</summary>
    LowerLeft,
    /// <summary>Lower right corner.</summary>
    LowerRight,
    /// <summary>Outside the axes: in a band under the figure, shared by every panel that asks for it.</summary>
    Below,
}

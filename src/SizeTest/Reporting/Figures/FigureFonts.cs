namespace SizeTest.Reporting.Figures;

/// <summary>Font sizes of a figure in points at its printed size.</summary>
/// <param name="TickPoints">Tick labels and notes.</param>
/// <param name="AxisPoints">Axis labels.</param>
/// <param name="TitlePoints">Figure and panel titles.</param>
/// <param name="LegendPoints">Legend entries.</param>
public sealed record FigureFonts(double TickPoints, double AxisPoints, double TitlePoints, double LegendPoints)
{
    /// <summary>Screen and report sizes (11, 13, 14 and 11 px at 96 px per inch).</summary>
    public static FigureFonts Screen { get; } = new(8.25, 9.75, 10.5, 8.25);

    /// <summary>
    /// Journal sizes at print size: 8 pt ticks and legend, 9 pt axis labels and titles (common practice: journals ask
    /// for 6–10 pt lettering at the printed width, about 8–9 pt for body labels).
    /// </summary>
    public static FigureFonts Journal { get; } = new(8.0, 9.0, 9.0, 8.0);
}

namespace SizeTest.Reporting.Figures;

/// <summary>
/// A figure as plain data: a title, a caption, a grid of panels and a physical size. Built by
/// the figure builders from report data and turned into PNG/SVG/PDF by
/// <see cref="Rendering.FigureRenderer"/>, the only code that knows the plotting library.
/// </summary>
/// <remarks>
/// Panels sit on a grid of <see cref="RowHeights"/>.Count rows and <see cref="Columns"/>
/// columns; each panel names its cell. Rows take heights in proportion to
/// <see cref="RowHeights"/> (e.g. 3:1 for a main panel over a residual panel).
/// </remarks>
public sealed record FigureSpec
{
    /// <summary>File stem and HTML anchor, lower-case letters, digits and '-' (e.g. <c>angular-size</c>).</summary>
    public required string Id { get; init; }

    /// <summary>Title drawn above the top-left panel and used as the caption heading.</summary>
    public required string Title { get; init; }

    /// <summary>Caption: what is plotted and how to read it (one paragraph).</summary>
    public required string Caption { get; init; }

    /// <summary>The panels, each in its own grid cell.</summary>
    public required IReadOnlyList<PanelSpec> Panels { get; init; }

    /// <summary>Relative row heights; the count is the number of grid rows. Default one row.</summary>
    public IReadOnlyList<double> RowHeights { get; init; } = [1.0];

    /// <summary>Number of grid columns. Default 1.</summary>
    public int Columns { get; init; } = 1;

    /// <summary>Figure width in inches (default 6.4 in).</summary>
    public double WidthInches { get; init; } = 6.4;

    /// <summary>Figure height in inches (default 4.8 in).</summary>
    public double HeightInches { get; init; } = 4.8;

    /// <summary>Font sizes at the printed size (default <see cref="FigureFonts.Screen"/>).</summary>
    public FigureFonts Fonts { get; init; } = FigureFonts.Screen;

    /// <summary>
    /// The same figure for the journal pack: <paramref name="width"/> wide, the height scaled to keep the aspect ratio,
    /// and <see cref="FigureFonts.Journal"/> lettering at that printed size (the layout is redone, not shrunk).
    /// </summary>
    public FigureSpec AtWidth(FigureWidth width) =>
        this with { WidthInches = width.Inches, HeightInches = HeightInches * width.Inches / WidthInches, Fonts = FigureFonts.Journal };

    /// <summary>Total number of series over all panels.</summary>
    public int SeriesCount => Panels.Sum(p => p.Series.Count);
}

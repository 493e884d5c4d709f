namespace SizeTest.Reporting.Figures;

/// <summary>
/// Base of every drawable series. All coordinates are in data units (linear even on a log
/// axis: the renderer takes the logarithm). A series with an empty <see cref="Label"/> has no
/// legend entry.
/// </summary>
/// <param name="Label">Legend text, or empty.</param>
public abstract record SeriesSpec(string Label)
{
    /// <summary>Colour as "#RRGGBB"; see <see cref="Palette"/>.</summary>
    public string Color { get; init; } = Palette.Data;

    /// <summary>Opacity 0–1 (1 = opaque).</summary>
    public double Alpha { get; init; } = 1.0;

    /// <summary>Every x coordinate the series covers (for axis limits and checks).</summary>
    public abstract IEnumerable<double> XExtent();

    /// <summary>Every y coordinate the series covers (for axis limits and checks).</summary>
    public abstract IEnumerable<double> YExtent();
}

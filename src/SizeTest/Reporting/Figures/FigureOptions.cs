namespace SizeTest.Reporting.Figures;

/// <summary>Choices the figure builders make that a study may want to change.</summary>
public sealed record FigureOptions
{
    /// <summary>Above this many objects, data are drawn as a 2-D density instead of individual points.</summary>
    public int DensityThreshold { get; init; } = 1500;

    /// <summary>Largest number of parameters in a corner plot (the first ones are kept); by default every free parameter of a model is shown.</summary>
    public int MaxCornerParameters { get; init; } = 16;

    /// <summary>Defaults.</summary>
    public static FigureOptions Default { get; } = new();
}

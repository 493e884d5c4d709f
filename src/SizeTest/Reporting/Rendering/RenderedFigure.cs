using SkiaSharp;

namespace SizeTest.Reporting.Rendering;

/// <summary>What the renderer actually drew: the logical size and, per panel, its data area and axis limits.</summary>
/// <param name="Width">Logical width (96-dpi pixels).</param>
/// <param name="Height">Logical height.</param>
/// <param name="Panels">One entry per panel, in the order of <see cref="Figures.FigureSpec.Panels"/>.</param>
public sealed record RenderedFigure(float Width, float Height, IReadOnlyList<RenderedPanel> Panels)
{
    /// <summary>The legend band under the panels in logical pixels (empty when the figure has none there).</summary>
    public SKRect LegendRect { get; init; } = SKRect.Empty;
}

/// <summary>One drawn panel.</summary>
/// <param name="DataRect">Data area in logical pixels (y down).</param>
/// <param name="XMin">Lower x limit in data units (not log10).</param>
/// <param name="XMax">Upper x limit in data units.</param>
/// <param name="YMin">Lower y limit in data units.</param>
/// <param name="YMax">Upper y limit in data units.</param>
/// <param name="SeriesDrawn">Number of series that produced something visible.</param>
/// <param name="PointsDropped">Points left out because a log axis cannot show values ≤ 0.</param>
public sealed record RenderedPanel(SKRect DataRect, double XMin, double XMax, double YMin, double YMax, int SeriesDrawn, int PointsDropped);

/// <summary>A rendered PNG with its pixel size and layout.</summary>
/// <param name="Bytes">PNG file bytes.</param>
/// <param name="Width">Width in pixels.</param>
/// <param name="Height">Height in pixels.</param>
/// <param name="Scale">Pixels per logical pixel (dpi / 96).</param>
/// <param name="Layout">What was drawn where, in logical pixels.</param>
public sealed record RenderedPng(byte[] Bytes, int Width, int Height, float Scale, RenderedFigure Layout);

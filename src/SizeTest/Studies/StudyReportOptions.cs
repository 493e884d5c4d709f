using SizeTest.Reporting.Pdf;

namespace SizeTest.Studies;

/// <summary>The <c>[report]</c> table of a study file.</summary>
public sealed record StudyReportOptions
{
    /// <summary>Report title (default: the study name).</summary>
    public string? Title { get; init; }
    /// <summary>Paper size of report.pdf.</summary>
    public PaperSize Paper { get; init; } = PaperSize.A4;
    /// <summary>Write report.html.</summary>
    public bool Html { get; init; } = true;
    /// <summary>Write report.pdf.</summary>
    public bool Pdf { get; init; } = true;
    /// <summary>Write each figure as 300-dpi PNG.</summary>
    public bool FigurePng { get; init; } = true;
    /// <summary>Write each figure as SVG.</summary>
    public bool FigureSvg { get; init; } = true;
    /// <summary>Write each figure as a vector PDF.</summary>
    public bool FigurePdf { get; init; } = true;
    /// <summary>Printed width of the figure pack (<c>figure_width</c>); null keeps each figure's own size.</summary>
    public SizeTest.Reporting.Figures.FigureWidth? FigureWidth { get; init; }
    /// <summary>Redshift bins of the binned medians and means.</summary>
    public int Bins { get; init; } = 8;
    /// <summary>Bootstrap resamples of each bin's statistic.</summary>
    public int BinResamples { get; init; } = 200;

    /// <summary>The format names <c>formats = [...]</c> accepts.</summary>
    public static IReadOnlyList<string> FormatNames { get; } = ["html", "pdf", "png", "svg", "figure-pdf"];
}

namespace SizeTest.Reporting.Pdf;

/// <summary>Page sizes of the PDF report, in PostScript points (1/72 in).</summary>
/// <param name="Name">Name (e.g. "A4").</param>
/// <param name="WidthPt">Width in points.</param>
/// <param name="HeightPt">Height in points.</param>
public sealed record PaperSize(string Name, float WidthPt, float HeightPt)
{
    /// <summary>ISO 216 A4, 210 × 297 mm = 595.28 × 841.89 pt.</summary>
    public static PaperSize A4 { get; } = new("A4", 595.2756f, 841.8898f);

    /// <summary>US Letter, 8.5 × 11 in = 612 × 792 pt.</summary>
    public static PaperSize Letter { get; } = new("Letter", 612f, 792f);

    /// <summary>Parses "a4" or "letter" (case-insensitive); false otherwise.</summary>
    public static bool TryParse(string? text, out PaperSize size)
    {
        switch (text?.Trim().ToLowerInvariant())
        {
            case "a4": size = A4; return true;
            case "letter": size = Letter; return true;
            default: size = A4; return false;
        }
    }
}

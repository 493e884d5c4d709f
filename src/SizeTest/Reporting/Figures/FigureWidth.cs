using System.Globalization;

namespace SizeTest.Reporting.Figures;

/// <summary>
/// The printed width of the journal figure pack: a journal's single column, its full page width
/// (double column), or a number of inches. Common practice: a single column is about 3.3 in
/// (84 mm) and a double column about 7 in (178 mm) wide.
/// </summary>
public readonly record struct FigureWidth(string Name, double Inches)
{
    /// <summary>Single-column width (3.3 in, common practice).</summary>
    public static FigureWidth SingleColumn { get; } = new("single-column", 3.3);

    /// <summary>Double-column (full text) width (7 in, common practice).</summary>
    public static FigureWidth DoubleColumn { get; } = new("double-column", 7.0);

    /// <summary>Narrowest and widest width accepted, inches.</summary>
    public const double MinInches = 1.0, MaxInches = 20.0;

    /// <summary>Parses <c>"single-column"</c>, <c>"double-column"</c> or a width in inches (a number or its text).</summary>
    public static bool TryParse(object? value, out FigureWidth width)
    {
        width = default;
        switch (value)
        {
            case "single-column": width = SingleColumn; return true;
            case "double-column": width = DoubleColumn; return true;
            case string s when double.TryParse(s, NumberStyles.Float, CultureInfo.InvariantCulture, out var d): return FromInches(d, out width);
            case long l: return FromInches(l, out width);
            case double d: return FromInches(d, out width);
            default: return false;
        }
    }

    private static bool FromInches(double inches, out FigureWidth width)
    {
        width = new FigureWidth(inches.ToString("R", CultureInfo.InvariantCulture) + " in", inches);
        return inches is >= MinInches and <= MaxInches;
    }
}

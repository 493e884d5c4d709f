namespace SizeTest.Reporting.Figures;

/// <summary>
/// SizeTest's colours. Model colours are taken in this order from the colour-blind-safe set of
/// Okabe &amp; Ito (2008, "Color Universal Design"), leaving out its yellow (too light on white)
/// and its black (kept for reference curves): blue #0072B2, vermillion #D55E00, bluish green
/// #009E73, reddish purple #CC79A7, orange #E69F00, sky blue #56B4E9. Data are neutral grey,
/// reference curves black, and densities a white-to-blue ramp (one hue, so order is readable
/// in any colour vision and in greyscale).
/// </summary>
public static class Palette
{
    /// <summary>Model colours in order of use.</summary>
    public static IReadOnlyList<string> Models { get; } = ["#0072B2", "#D55E00", "#009E73", "#CC79A7", "#E69F00", "#56B4E9"];

    /// <summary>Individual data points: grey #7A7A7A.</summary>
    public const string Data = "#7A7A7A";

    /// <summary>Binned statistics and reference curves: black.</summary>
    public const string Ink = "#000000";

    /// <summary>Secondary reference (e.g. the static-universe dimming curve): dark grey #4D4D4D.</summary>
    public const string Reference = "#4D4D4D";

    /// <summary>Limits and warnings (the SB limit line): Okabe–Ito vermillion-orange #E66100.</summary>
    public const string Warn = "#B35900";

    /// <summary>Lightest end of the density ramp (white).</summary>
    public const string DensityLow = "#FFFFFF";

    /// <summary>Darkest end of the density ramp (Okabe–Ito blue darkened, #003A5C).</summary>
    public const string DensityHigh = "#003A5C";

    /// <summary>Colour of model <paramref name="index"/> (cycles after six).</summary>
    public static string Model(int index) => Models[((index % Models.Count) + Models.Count) % Models.Count];
}

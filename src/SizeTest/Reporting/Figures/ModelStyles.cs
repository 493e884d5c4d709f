namespace SizeTest.Reporting.Figures;

/// <summary>
/// One fixed colour and line style per world model, the same in every report whatever the ranking (colours from
/// the colour-blind-safe set of Okabe &amp; Ito 2008; static models dashed so they stay apart in greyscale).
/// Dotted lines are kept for "no evolution" and reference curves.
/// </summary>
public static class ModelStyles
{
    private static readonly Dictionary<string, (string Color, DashKind Dash)> Styles = new(StringComparer.OrdinalIgnoreCase)
    {
        ["lcdm"] = ("#0072B2", DashKind.Solid),          // blue
        ["eds"] = ("#D55E00", DashKind.Solid),           // vermillion
        ["milne"] = ("#009E73", DashKind.Solid),         // bluish green
        ["wcdm"] = ("#56B4E9", DashKind.DashDot),        // sky blue
        ["w0wacdm"] = ("#8C6D1F", DashKind.DashDot),     // dark ochre (Okabe–Ito yellow darkened for white paper)
        ["static-linear"] = ("#CC79A7", DashKind.Dashed),// reddish purple
        ["tired-light"] = ("#E69F00", DashKind.Dashed),  // orange
    };

    /// <summary>The colour of a model (grey for a model SizeTest does not know).</summary>
    public static string Color(string model) => Styles.TryGetValue(model, out var s) ? s.Color : "#666666";

    /// <summary>The line style of a model's fitted curve.</summary>
    public static DashKind Dash(string model) => Styles.TryGetValue(model, out var s) ? s.Dash : DashKind.Solid;
}

using SizeTest.Foundation.Errors;

namespace SizeTest.Simulation;

/// <summary>
/// One population of a mixed mock (e.g. early and late types): its share of the drawn objects and its own
/// size parameters, R = R0 (L/L_pivot)^β (1+z)^a with log-normal scatter. Written to the <c>group</c> column.
/// </summary>
/// <param name="Name">Group label.</param>
/// <param name="Fraction">Share of drawn objects (the shares are normalised to sum to 1).</param>
/// <param name="R0Kpc">Size at z = 0 (and at the pivot luminosity), kpc.</param>
/// <param name="SizeEvolution">a.</param>
/// <param name="SizeLuminositySlope">β.</param>
/// <param name="ScatterDex">Scatter of log10 R, dex.</param>
public sealed record MockSubpopulation(string Name, double Fraction, double R0Kpc, double SizeEvolution, double SizeLuminositySlope, double ScatterDex)
{
    /// <summary>Parses <c>NAME:FRACTION:R0_KPC:A[:BETA[:SCATTER_DEX]]</c> (β default 0, scatter default 0.2).</summary>
    public static MockSubpopulation Parse(string text)
    {
        var p = (text ?? "").Split(':');
        double N(int i, double d)
        {
            if (i >= p.Length) return d;
            return double.TryParse(p[i], System.Globalization.NumberStyles.Float, System.Globalization.CultureInfo.InvariantCulture, out var v) && double.IsFinite(v)
                ? v : throw SettingProblem.Input($"{{population}} '{text}': '{p[i]}' is not a number; write NAME:FRACTION:R0_KPC:A[:BETA[:SCATTER_DEX]], e.g. early:0.4:3:-1.5:0.3:0.15");
        }
        if (p.Length < 4 || p.Length > 6 || p[0].Trim().Length == 0)
            throw SettingProblem.Input($"{{population}} '{text}' must be NAME:FRACTION:R0_KPC:A[:BETA[:SCATTER_DEX]], e.g. early:0.4:3:-1.5:0.3:0.15");
        var s = new MockSubpopulation(p[0].Trim(), N(1, 0), N(2, 0), N(3, 0), N(4, 0), N(5, 0.2));
        if (!(s.Fraction > 0)) throw SettingProblem.Input($"{{population}} '{text}': the fraction must be positive");
        if (!(s.R0Kpc > 0)) throw SettingProblem.Input($"{{population}} '{text}': R0 must be positive (kpc)");
        if (!(s.ScatterDex >= 0)) throw SettingProblem.Input($"{{population}} '{text}': the scatter must be ≥ 0");
        return s;
    }
}

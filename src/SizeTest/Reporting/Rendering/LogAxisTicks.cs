using System.Globalization;

namespace SizeTest.Reporting.Rendering;

/// <summary>
/// Ticks for a logarithmic axis drawn in log10 coordinates (the plotting library has no log
/// axis of its own). Decades are major ticks, 2…9 × 10ⁿ are minor ticks. When at least three
/// decades are visible the decades are labelled 10ⁿ with superscript digits; on a narrower axis
/// the 1-, 2- and 5-multiples are labelled as plain numbers (0.2, 0.5, 1, 2), so every axis has
/// at least two labels; on an axis narrower than one decade every integer multiple is labelled.
/// </summary>
public static class LogAxisTicks
{
    /// <summary>Ticks covering [<paramref name="log10Min"/>, <paramref name="log10Max"/>].</summary>
    public static IReadOnlyList<AxisTick> Generate(double log10Min, double log10Max)
    {
        if (!(log10Max > log10Min)) throw new ArgumentException("log axis range must have max > min");
        var ticks = new List<AxisTick>();
        int first = (int)Math.Floor(log10Min), last = (int)Math.Ceiling(log10Max);
        int decadesInside = Enumerable.Range(first, last - first + 1).Count(d => d >= log10Min - 1e-9 && d <= log10Max + 1e-9);
        bool decadeLabels = decadesInside >= 3;
        bool allLabels = log10Max - log10Min < 1.0;
        for (int d = first; d <= last; d++)
        {
            for (int m = 1; m <= 9; m++)
            {
                double p = d + Math.Log10(m);
                if (p < log10Min - 1e-9 || p > log10Max + 1e-9) continue;
                if (m == 1)
                    ticks.Add(new AxisTick(p, decadeLabels ? PowerOfTen(d) : Plain(m, d), true));
                else if (!decadeLabels && (allLabels || m == 2 || m == 5))
                    ticks.Add(new AxisTick(p, Plain(m, d), true));
                else
                    ticks.Add(new AxisTick(p, "", false));
            }
        }
        // A very narrow axis (less than a factor 2) may hold fewer than two labelled ticks: add the ends.
        if (ticks.Count(t => t.Major) < 2)
        {
            ticks.RemoveAll(t => t.Major);
            ticks.Add(new AxisTick(log10Min, Significant(Math.Pow(10, log10Min)), true));
            ticks.Add(new AxisTick(log10Max, Significant(Math.Pow(10, log10Max)), true));
        }
        return ticks;
    }

    /// <summary>"10ⁿ" with Unicode superscript digits and minus (e.g. 10⁻²).</summary>
    public static string PowerOfTen(int exponent)
    {
        const string digits = "⁰¹²³⁴⁵⁶⁷⁸⁹";
        var s = exponent.ToString(CultureInfo.InvariantCulture);
        var chars = s.Select(c => c == '-' ? '⁻' : digits[c - '0']);
        return "10" + new string(chars.ToArray());
    }

    private static string Plain(int mantissa, int exponent) =>
        (mantissa * Math.Pow(10, exponent)).ToString("0.#########", CultureInfo.InvariantCulture);

    private static string Significant(double v) => v.ToString("G3", CultureInfo.InvariantCulture);
}

using System.Globalization;

namespace SizeTest.Foundation.Text;

/// <summary>
/// Rounds a value to its uncertainty by the Particle Data Group's rule (Review of Particle Physics, Introduction,
/// §5.3 "Rounding" [from memory]): take the three highest-order digits of the error; if they lie between 100 and
/// 354, keep two significant digits of the error; between 355 and 949, keep one; between 950 and 999, round the
/// error up to 1000 and keep two significant digits (so 0.0987 becomes 0.10). The value is then rounded to the
/// same decimal place as the error. For an asymmetric interval the smaller of the two errors sets the place
/// (common practice). Used for every number people read (HTML, PDF, LaTeX, CLI); machine outputs keep full
/// precision.
/// </summary>
public static class PdgRounding
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <summary>The Unicode minus sign used in text for people.</summary>
    public const string Minus = "−";

    /// <summary>
    /// The number of decimal places (negative: tens, hundreds …) that the PDG rule keeps for an error, or null when
    /// the error is not a positive finite number.
    /// </summary>
    public static int? Decimals(double error)
    {
        if (!(error > 0) || !double.IsFinite(error)) return null;
        int exp = (int)Math.Floor(Math.Log10(error));
        // Three highest-order digits 100 … 999 (guard against log10 rounding at exact powers of ten).
        double scaled = error / Math.Pow(10, exp - 2);
        if (scaled >= 999.5) { exp++; scaled /= 10; }
        if (scaled < 99.5) { exp--; scaled *= 10; }
        int three = (int)Math.Round(scaled);
        if (three <= 354) return 1 - exp;           // two significant digits
        if (three <= 949) return -exp;              // one significant digit
        return 1 - (exp + 1);                       // 950–999 → 1000: two significant digits of the next decade
    }

    /// <summary>Rounds <paramref name="error"/> as the rule says (0.0987 → 0.10, 0.355 → 0.4, 0.354 → 0.35).</summary>
    public static double RoundError(double error) => Decimals(error) is { } d ? RoundTo(error, d) : error;

    /// <summary>The value and error as two strings with the same number of decimals ("−1.018", "0.034").</summary>
    public static (string Value, string Error) Format(double value, double error)
    {
        if (Decimals(error) is not { } d) return (Plain(value), double.IsFinite(error) ? Plain(error) : "");
        return (Fixed(RoundTo(value, d), d), Fixed(RoundTo(error, d), d));
    }

    /// <summary>"value ± error" rounded by the rule; a value without a usable error gets four significant digits.</summary>
    public static string ValueWithError(double value, double error)
    {
        var (v, e) = Format(value, error);
        return e.Length == 0 ? v : $"{v} ± {e}";
    }

    /// <summary>
    /// A value with its 68% interval [lo, hi]: "v ± e" when the interval is symmetric at the printed precision,
    /// otherwise "v +u −l" (superscript/subscript-free, for tables and plain text).
    /// </summary>
    public static string ValueWithInterval(double value, double lo, double hi)
    {
        double up = hi - value, down = value - lo;
        if (!(up >= 0) || !(down >= 0) || !double.IsFinite(up + down)) return Plain(value);
        double small = Math.Min(up, down) > 0 ? Math.Min(up, down) : Math.Max(up, down);
        if (Decimals(small) is not { } d) return Plain(value);
        string v = Fixed(RoundTo(value, d), d), u = Fixed(RoundTo(up, d), d), l = Fixed(RoundTo(down, d), d);
        return u == l ? $"{v} ± {u}" : $"{v} +{u} {Minus}{l}";
    }

    /// <summary>The value alone at the precision its interval gives (for table cells beside separate lo/hi columns).</summary>
    public static string ValueAtPrecision(double value, double lo, double hi)
    {
        double up = hi - value, down = value - lo;
        double small = Math.Min(up, down) > 0 ? Math.Min(up, down) : Math.Max(up, down);
        return Decimals(small) is { } d ? Fixed(RoundTo(value, d), d) : Plain(value);
    }

    /// <summary>The interval's ends "lo … hi" at the precision the smaller side gives.</summary>
    public static string IntervalBounds(double value, double lo, double hi)
    {
        double up = hi - value, down = value - lo;
        double small = Math.Min(up, down) > 0 ? Math.Min(up, down) : Math.Max(up, down);
        return Decimals(small) is { } d ? $"{Fixed(RoundTo(lo, d), d)} … {Fixed(RoundTo(hi, d), d)}" : $"{Plain(lo)} … {Plain(hi)}";
    }

    /// <summary><paramref name="x"/> at <paramref name="decimals"/> places of the precision an error gives.</summary>
    public static string AtDecimals(double x, int decimals) => Fixed(RoundTo(x, decimals), decimals);

    /// <summary>A number without an error: four significant digits, Unicode minus (for people).</summary>
    public static string Plain(double x)
    {
        if (double.IsNaN(x)) return "";
        if (double.IsInfinity(x)) return x > 0 ? "∞" : Minus + "∞";
        if (x == 0) return "0";
        double a = Math.Abs(x);
        string s = a >= 1e5 || a < 1e-3 ? x.ToString("0.###e+0", Inv) : x.ToString("G4", Inv);
        if (s.Contains('E', StringComparison.Ordinal)) s = x.ToString("0.###e+0", Inv);
        return s.Replace("-", Minus, StringComparison.Ordinal);
    }

    private static double RoundTo(double x, int decimals)
    {
        if (decimals >= 0 && decimals <= 15) return Math.Round(x, decimals, MidpointRounding.AwayFromZero);
        double f = Math.Pow(10, decimals);
        return Math.Round(x * f, MidpointRounding.AwayFromZero) / f;
    }

    private static string Fixed(double x, int decimals)
    {
        string s = decimals > 0 ? x.ToString("F" + Math.Min(decimals, 15).ToString(Inv), Inv) : Math.Round(x).ToString("F0", Inv);
        if (s.StartsWith('-') && s.Trim('-', '0', '.').Length == 0) s = s[1..]; // no "−0.00"
        return s.Replace("-", Minus, StringComparison.Ordinal);
    }
}

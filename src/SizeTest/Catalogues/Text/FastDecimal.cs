using System.Globalization;

namespace SizeTest.Catalogues.Text;

/// <summary>
/// Parses UTF-8 decimal numbers. Plain decimals with at most 15 significant digits and no
/// exponent (the usual catalogue cell: <c>0.25</c>, <c>-21.375</c>) take an exact fast path:
/// the digits form an integer m &lt; 10¹⁵ &lt; 2⁵³ and the value is m / 10^k with k ≤ 22, both
/// exactly representable, so one IEEE division gives the correctly rounded result (Clinger 1990,
/// "How to read floating point numbers accurately", the exact fast case). Everything else goes
/// to <see cref="double.TryParse(ReadOnlySpan{byte}, NumberStyles, IFormatProvider?, out double)"/>.
/// </summary>
internal static class FastDecimal
{
    private static readonly double[] Pow10 =
    [
        1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15,
        1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22,
    ];

    public static bool TryParse(ReadOnlySpan<byte> s, out double value)
    {
        int i = 0, n = s.Length;
        bool negative = false;
        if (n > 0 && (s[0] == (byte)'-' || s[0] == (byte)'+')) { negative = s[0] == (byte)'-'; i = 1; }
        long m = 0;
        int digits = 0, frac = 0;
        bool dot = false, any = false;
        for (; i < n; i++)
        {
            byte c = s[i];
            if (c >= (byte)'0' && c <= (byte)'9')
            {
                any = true;
                if (m == 0 && c == (byte)'0') { if (dot) frac++; continue; } // leading zeros are not significant
                if (++digits > 15) return Slow(s, out value);
                m = m * 10 + (c - '0');
                if (dot) frac++;
            }
            else if (c == (byte)'.' && !dot) dot = true;
            else return Slow(s, out value);
        }
        if (!any || frac > 22) return Slow(s, out value);
        double v = m / Pow10[frac];
        value = negative ? -v : v;
        return true;
    }

    private static bool Slow(ReadOnlySpan<byte> s, out double value) =>
        double.TryParse(s, NumberStyles.Float, CultureInfo.InvariantCulture, out value);
}

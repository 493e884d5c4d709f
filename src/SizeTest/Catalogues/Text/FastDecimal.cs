using System.Globalization;
using System.Numerics;

namespace SizeTest.Catalogues.Text;

/// <summary>
/// Parses UTF-8 decimal numbers (<c>[sign] digits [. digits] [e|E [sign] digits]</c>) straight from the bytes of a
/// cell, correctly rounded, without allocating. The digits form an integer w (at most 19 significant digits) and the
/// value is w·10^q. Two exact paths cover the usual catalogue cells, including the 17-digit round-trip form of a double:
/// <list type="bullet">
/// <item>w ≤ 2⁵³ and |q| ≤ 22: w and 10^|q| are both exact doubles, so one IEEE multiplication or division gives the
/// correctly rounded result (Clinger 1990, "How to read floating point numbers accurately", the exact fast case);</item>
/// <item>otherwise, for −100 ≤ q ≤ 100 and a normal result: the Eisel–Lemire algorithm (Lemire 2021, "Number parsing
/// at a gigabyte per second", Software: Practice and Experience 51, §5 and Algorithm 1): w normalised to 64 bits times a
/// 128-bit truncation of 5^q (<see cref="PowersOfFive"/>), the binary exponent from ⌊q·log₂10⌋, and round-to-nearest-even
/// from the product's low bits.</item>
/// </list>
/// Everything else — more than 19 significant digits, subnormal or overflowing results, an ambiguous product, or any
/// other spelling — goes to <see cref="double.TryParse(ReadOnlySpan{byte}, NumberStyles, IFormatProvider?, out double)"/>,
/// so the answer always equals the runtime parser's, bit for bit (tests/SizeTest.Tests/Catalogues/FastDecimalTests.cs).
/// </summary>
internal static class FastDecimal
{
    private static readonly double[] Pow10 =
    [
        1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15,
        1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22,
    ];

    /// <summary>Smallest and largest decimal exponent q of the Eisel–Lemire path (and of <see cref="PowersOfFive"/>).</summary>
    private const int MinQ = -100, MaxQ = 100;

    // 128-bit approximations of 5^q for q = MinQ … MaxQ, high word then low word, normalised so the top bit is set:
    // for q ≥ 0 the truncation of 5^q·2^s; for −27 ≤ q < 0, ⌊2^b / 5^−q⌋ + 1 with b = z + 127 (2^(z−1) < 5^−q < 2^z);
    // for q < −27, ⌊2^(2z+128) / 5^−q⌋ + 1 truncated to 128 bits — the table of Lemire 2021 (§5), computed here exactly
    // with integers at first use rather than stored.
    private static readonly Lazy<ulong[]> PowersOfFive = new(BuildPowersOfFive);

    /// <summary>Parses <paramref name="s"/>; false when it is no invariant-culture number.</summary>
    public static bool TryParse(ReadOnlySpan<byte> s, out double value)
    {
        int i = 0, n = s.Length;
        bool negative = false;
        if (n > 0 && (s[0] == (byte)'-' || s[0] == (byte)'+')) { negative = s[0] == (byte)'-'; i = 1; }
        ulong w = 0;
        int digits = 0, frac = 0;
        bool dot = false, any = false;
        for (; i < n; i++)
        {
            byte c = s[i];
            if (c - (uint)'0' <= 9)
            {
                any = true;
                if (w == 0 && c == (byte)'0') { if (dot) frac++; continue; } // leading zeros are not significant
                if (++digits > 19) return Slow(s, out value);
                w = w * 10 + (ulong)(c - '0');
                if (dot) frac++;
            }
            else if (c == (byte)'.' && !dot) dot = true;
            else break;
        }
        if (!any) return Slow(s, out value);
        int exp = 0;
        if (i < n)
        {
            if ((s[i] | 0x20) != (byte)'e' || ++i == n) return Slow(s, out value);
            bool expNegative = false;
            if (s[i] == (byte)'-' || s[i] == (byte)'+') { expNegative = s[i] == (byte)'-'; if (++i == n) return Slow(s, out value); }
            int expDigits = 0;
            for (; i < n; i++)
            {
                uint d = s[i] - (uint)'0';
                if (d > 9 || ++expDigits > 4) return Slow(s, out value);
                exp = exp * 10 + (int)d;
            }
            if (expNegative) exp = -exp;
        }
        if (w == 0) { value = negative ? -0.0 : 0.0; return true; }
        int q = exp - frac;
        double v;
        if (w <= 1UL << 53 && q >= -22 && q <= 22) v = q >= 0 ? w * Pow10[q] : w / Pow10[-q];
        else if (!TryEiselLemire(w, q, out v)) return Slow(s, out value);
        value = negative ? -v : v;
        return true;
    }

    /// <summary>w·10^q correctly rounded for w ≠ 0 (Lemire 2021, Algorithm 1); false where this path does not decide.</summary>
    private static bool TryEiselLemire(ulong w, int q, out double value)
    {
        value = 0;
        if (q < MinQ || q > MaxQ) return false;
        var table = PowersOfFive.Value;
        int lz = BitOperations.LeadingZeroCount(w);
        w <<= lz;
        int index = 2 * (q - MinQ);
        ulong high = Math.BigMul(w, table[index], out ulong low);
        const ulong precisionMask = 0x1FF; // the 64 − (52 + 3) bits below the 55 that decide the mantissa and its rounding
        if ((high & precisionMask) == precisionMask)
        {
            ulong secondHigh = Math.BigMul(w, table[index + 1], out _);
            low += secondHigh;
            if (secondHigh > low) high++;
        }
        if (low == ulong.MaxValue) return false; // the product may be one unit short: let the exact parser decide
        int upperBit = (int)(high >> 63);
        ulong mantissa = high >> (upperBit + 9);
        int power2 = ((217706 * q) >> 16) + 63 + upperBit - lz + 1023; // ⌊q·log₂10⌋ + 63 + upper bit − lz − (−1023)
        if (power2 <= 0) return false; // subnormal: the exact parser
        // Exactly half-way between two doubles (possible only for −4 ≤ q ≤ 23): round to even.
        if (low <= 1 && q >= -4 && q <= 23 && (mantissa & 3) == 1 && (mantissa << (upperBit + 9)) == high) mantissa &= ~1UL;
        mantissa += mantissa & 1;
        mantissa >>= 1;
        if (mantissa >= 2UL << 52) { mantissa = 1UL << 52; power2++; }
        mantissa &= ~(1UL << 52);
        if (power2 >= 0x7FF) return false;
        value = BitConverter.Int64BitsToDouble((long)(mantissa | ((ulong)power2 << 52)));
        return true;
    }

    private static ulong[] BuildPowersOfFive()
    {
        var table = new ulong[2 * (MaxQ - MinQ + 1)];
        var two128 = BigInteger.One << 128;
        for (int q = MinQ; q <= MaxQ; q++)
        {
            BigInteger c;
            if (q >= 0)
            {
                c = BigInteger.Pow(5, q);
                int bits = (int)c.GetBitLength();
                c = bits <= 128 ? c << (128 - bits) : c >> (bits - 128);
            }
            else
            {
                var p5 = BigInteger.Pow(5, -q);
                int z = (int)(p5 - 1).GetBitLength(); // the least z with 2^z ≥ 5^−q
                c = q >= -27 ? (BigInteger.One << (z + 127)) / p5 + 1 : (BigInteger.One << (2 * z + 128)) / p5 + 1;
                while (c >= two128) c >>= 1;
            }
            int k = 2 * (q - MinQ);
            table[k] = (ulong)(c >> 64);
            table[k + 1] = (ulong)(c & ulong.MaxValue);
        }
        return table;
    }

    private static bool Slow(ReadOnlySpan<byte> s, out double value) =>
        double.TryParse(s, NumberStyles.Float, CultureInfo.InvariantCulture, out value);
}

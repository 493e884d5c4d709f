using System.Globalization;
using System.Text;
using CsCheck;
using SizeTest.Catalogues.Text;
using Xunit;

namespace SizeTest.Tests.Catalogues;

public sealed class FastDecimalTests
{
    [Fact]
    public void AgreesBitForBitWithTheRuntimeParser()
    {
        // Reference: .NET's correctly rounded double.Parse. Cases: random doubles in several formats,
        // and random digit strings with a decimal point anywhere.
        var formats = new[] { "R", "F0", "F3", "F6", "G6", "G15", "E4" };
        var fromDoubles = Gen.Select(Gen.Double[-1e6, 1e6], Gen.Int[0, formats.Length - 1], (d, f) => d.ToString(formats[f], CultureInfo.InvariantCulture));
        var fromDigits = Gen.Select(Gen.Char["0123456789"].Array[1, 20], Gen.Int[0, 20], Gen.Bool,
            (ds, dot, neg) => (neg ? "-" : "") + new string(ds).Insert(Math.Min(dot, ds.Length), "."));
        Gen.OneOf(fromDoubles, fromDigits).Sample(text =>
        {
            var bytes = Encoding.ASCII.GetBytes(text);
            bool ok = FastDecimal.TryParse(bytes, out var fast);
            bool refOk = double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out var expected);
            Assert.Equal(refOk, ok);
            if (ok) Assert.Equal(BitConverter.DoubleToInt64Bits(expected), BitConverter.DoubleToInt64Bits(fast));
        }, seed: "0000002qBaChBid1", iter: 20000, threads: 1);
    }

    [Fact]
    public void RoundTripFormsOfAnyDoubleAgreeBitForBit()
    {
        // Reference: .NET's correctly rounded double.Parse (IEEE 754 round-to-nearest-even). The shortest round-trip
        // ("R"), 17-digit ("G17", "E16") and exponent forms of doubles with random bit patterns (every exponent, so
        // subnormals, huge values and the Eisel–Lemire table's edges are all drawn), and decimal mantissas of up to
        // 21 digits with random exponents in ±330.
        var formats = new[] { "R", "G17", "E16", "E10", "G9" };
        var fromBits = Gen.Select(Gen.Long, Gen.Int[0, formats.Length - 1], (bits, f) =>
        {
            double d = BitConverter.Int64BitsToDouble(bits);
            return double.IsFinite(d) ? d.ToString(formats[f], CultureInfo.InvariantCulture) : "1";
        });
        var withExponent = Gen.Select(Gen.Char["0123456789"].Array[1, 21], Gen.Int[0, 21], Gen.Int[-330, 330], Gen.Int[0, 3],
            (ds, dot, e, style) => (style == 1 ? "-" : style == 2 ? "+" : "") + new string(ds).Insert(Math.Min(dot, ds.Length), ".") + (style == 3 ? "E" : "e") + e.ToString(CultureInfo.InvariantCulture));
        Gen.OneOf(fromBits, withExponent).Sample(AgreesWithRuntime, seed: "0000003xPqRt5Kd2", iter: 200000, threads: 1);
    }

    [Theory]
    // Edge cases checked against double.Parse (the reference): the largest and smallest normal doubles, subnormals
    // (the fallback), values just past the range, exact half-way cases between doubles (round to even: 2^53 + 1,
    // 2^53 + 3, 9007199254740993e10), 1e23 (a classic hard case), 19- and 20-digit mantissas, exponent spellings,
    // negative zero and signs.
    [InlineData("1.7976931348623157e308")]
    [InlineData("1.7976931348623158e308")]
    [InlineData("1.7976931348623159e308")]
    [InlineData("2.2250738585072014e-308")]
    [InlineData("2.2250738585072011e-308")]
    [InlineData("4.9406564584124654e-324")]
    [InlineData("5e-324")]
    [InlineData("2e-324")]
    [InlineData("1e309")]
    [InlineData("9007199254740993")]
    [InlineData("9007199254740995")]
    [InlineData("9007199254740993e10")]
    [InlineData("1e23")]
    [InlineData("8.98846567431158e307")]
    [InlineData("0.18584236740052903")]
    [InlineData("0.30000000000000004")]
    [InlineData("1234567890123456789")]
    [InlineData("12345678901234567890")]
    [InlineData("9999999999999999999e-19")]
    [InlineData("-0")]
    [InlineData("-0.0e5")]
    [InlineData("+1.5E+03")]
    [InlineData("1.5e-003")]
    [InlineData("5.e3")]
    [InlineData("1e99999")]
    [InlineData("1e")]
    [InlineData("1e+")]
    [InlineData("e5")]
    [InlineData("1.5x")]
    [InlineData("inf")]
    [InlineData("-Infinity")]
    [InlineData("NaN")]
    public void EdgeCasesAgreeWithTheRuntimeParser(string text) => AgreesWithRuntime(text);

    private static void AgreesWithRuntime(string text)
    {
        bool ok = FastDecimal.TryParse(Encoding.ASCII.GetBytes(text), out var fast);
        bool refOk = double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out var expected);
        Assert.True(refOk == ok, $"'{text}': runtime parser {(refOk ? "accepts" : "rejects")} it");
        if (ok) Assert.True(BitConverter.DoubleToInt64Bits(expected) == BitConverter.DoubleToInt64Bits(fast), $"'{text}': {fast:R} instead of {expected:R}");
    }

    [Theory]
    [InlineData("0.05", 0.05)]
    [InlineData("-21.375", -21.375)]
    [InlineData("100", 100.0)]
    [InlineData(".5", 0.5)]
    [InlineData("1e-3", 0.001)]
    public void Examples(string text, double expected)
    {
        Assert.True(FastDecimal.TryParse(Encoding.ASCII.GetBytes(text), out var v));
        Assert.Equal(expected, v); // decimal literals: the compiler's correctly rounded doubles
    }

    [Theory]
    [InlineData("")]
    [InlineData(".")]
    [InlineData("1.2.3")]
    [InlineData("abc")]
    [InlineData("-")]
    public void Rejects(string text) => Assert.False(FastDecimal.TryParse(Encoding.ASCII.GetBytes(text), out _));
}

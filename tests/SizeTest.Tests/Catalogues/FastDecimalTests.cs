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

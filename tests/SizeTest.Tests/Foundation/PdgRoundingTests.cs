using SizeTest.Foundation.Text;
using Xunit;

namespace SizeTest.Tests.Foundation;

/// <summary>
/// The Particle Data Group's rounding rule (Review of Particle Physics, Introduction §5.3 "Rounding" [from memory]):
/// the three highest-order digits of the error decide — 100–354: two significant digits; 355–949: one; 950–999:
/// round up to 1000 and keep two. The examples are the rule's own (0.827 → 0.8, 0.354 → 0.35, 0.355 → 0.4,
/// 0.950 → 1.0) plus values from this repository's demo report.
/// </summary>
public sealed class PdgRoundingTests
{
    [Theory]
    [InlineData(0.827, "0.8")]
    [InlineData(0.354, "0.35")]
    [InlineData(0.355, "0.4")]
    [InlineData(0.949, "0.9")]
    [InlineData(0.950, "1.0")]
    [InlineData(0.0987, "0.10")]
    [InlineData(0.1, "0.10")]
    [InlineData(1.0, "1.0")]
    [InlineData(12.3, "12")]
    [InlineData(47.0, "50")]
    [InlineData(0.034, "0.034")]
    [InlineData(0.0123, "0.012")]
    public void ErrorsAreRoundedByTheThreeDigitRule(double error, string expected)
    {
        Assert.Equal(expected, PdgRounding.Format(1.0, error).Error);
    }

    [Theory]
    // The examples: a = −0.0641954 with 68% half-width 0.034 and R0 = 4.33619 with 0.0523.
    [InlineData(-0.0641954, 0.034, "−0.064 ± 0.034")]
    [InlineData(4.33619, 0.0523, "4.34 ± 0.05")]
    [InlineData(-1.0181, 0.0335, "−1.018 ± 0.034")]
    [InlineData(6753.15, 12.3, "6753 ± 12")]
    [InlineData(123456.0, 470.0, "123500 ± 500")]
    [InlineData(-0.0004, 0.01, "0.000 ± 0.010")]
    public void ValuesTakeTheDecimalPlaceOfTheirError(double value, double error, string expected)
    {
        Assert.Equal(expected, PdgRounding.ValueWithError(value, error));
    }

    [Fact]
    public void AsymmetricIntervalsUseTheSmallerSideAndShowBoth()
    {
        // +0.12 / −0.034: the smaller side (0.034, digits 340 → two significant) sets three decimals.
        Assert.Equal("1.000 +0.120 −0.034", PdgRounding.ValueWithInterval(1.0, 0.966, 1.12));
        // ±0.03: digits 300 → two significant digits, so 0.030 and three decimals.
        Assert.Equal("1.020 ± 0.030", PdgRounding.ValueWithInterval(1.02, 0.99, 1.05));
    }

    [Fact]
    public void NoUsableErrorFallsBackToFourSignificantDigits()
    {
        Assert.Equal("4.336", PdgRounding.ValueWithError(4.33619, double.NaN));
        Assert.Equal("−0.0642", PdgRounding.Plain(-0.0641954));
    }
}

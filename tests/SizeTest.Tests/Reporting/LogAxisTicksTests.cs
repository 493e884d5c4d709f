using SizeTest.Reporting.Rendering;
using Xunit;

namespace SizeTest.Tests.Reporting;

public sealed class LogAxisTicksTests
{
    [Fact]
    public void WideAxesLabelDecadesAsPowersOfTen()
    {
        // 0.01 … 100: five decades inside, so decades only, labelled 10⁻² … 10² (exact positions are the integers).
        var t = LogAxisTicks.Generate(-2, 2);
        Assert.Equal(["10⁻²", "10⁻¹", "10⁰", "10¹", "10²"], t.Where(x => x.Major).Select(x => x.Label));
        Assert.Equal(4 * 8, t.Count(x => !x.Major)); // 2…9 in each of the four decades between
    }

    [Fact]
    public void NarrowAxesLabelOneTwoFive()
    {
        // 0.05 … 3 (1.78 decades): labelled 0.05, 0.1, 0.2, 0.5, 1, 2.
        var t = LogAxisTicks.Generate(Math.Log10(0.05), Math.Log10(3));
        Assert.Equal(["0.05", "0.1", "0.2", "0.5", "1", "2"], t.Where(x => x.Major).Select(x => x.Label));
    }

    [Fact]
    public void AxesUnderADecadeLabelEveryInteger()
    {
        var t = LogAxisTicks.Generate(0, Math.Log10(4.2));
        Assert.Equal(["1", "2", "3", "4"], t.Where(x => x.Major).Select(x => x.Label));
        Assert.Equal(Math.Log10(3), t.Single(x => x.Label == "3").Position, 12);
    }

    [Fact]
    public void TinyRangesStillGetTwoLabels()
    {
        var t = LogAxisTicks.Generate(Math.Log10(1.2), Math.Log10(1.5));
        Assert.True(t.Count(x => x.Major) >= 2);
    }
}

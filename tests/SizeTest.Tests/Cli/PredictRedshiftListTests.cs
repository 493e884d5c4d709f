using SizeTest.Cli;
using SizeTest.Foundation.Errors;
using Xunit;

namespace SizeTest.Tests.Cli;

public sealed class PredictRedshiftListTests
{
    [Fact]
    public void ParsesListsRangesAndMixtures()
    {
        Assert.Equal([0.1, 0.5, 1.0], RedshiftList.Parse("0.1,0.5,1"));
        Assert.Equal([0.5, 0.75, 1.0], RedshiftList.Parse("0.5:1:0.25"));
        Assert.Equal([0.1, 0.2, 0.3, 2.0], RedshiftList.Parse("0.1:0.3:0.1, 2"));
        Assert.Equal([1.0, 1.5], RedshiftList.Parse("1:1.9:0.5")); // stop not on the grid: last point ≤ stop
        Assert.Equal([2.0], RedshiftList.Parse("2:2:0.1"));
        Assert.Equal([1e-3], RedshiftList.Parse("1e-3"));
    }

    [Theory]
    [InlineData("")]
    [InlineData("a")]
    [InlineData("1,")]
    [InlineData("1:2")]
    [InlineData("1:2:3:4")]
    [InlineData("2:1:0.1")]
    [InlineData("1:2:-0.1")]
    [InlineData("0:100:0.00001")]
    public void RejectsMalformedInput(string text)
    {
        var ex = Assert.Throws<InputException>(() => RedshiftList.Parse(text));
        Assert.Contains("--z", ex.Message);
    }
}

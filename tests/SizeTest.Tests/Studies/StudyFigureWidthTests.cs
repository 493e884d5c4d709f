using SizeTest.Foundation.Errors;
using SizeTest.Studies;
using Xunit;

namespace SizeTest.Tests.Studies;

public sealed class StudyFigureWidthTests
{
    private const string Head = "[catalogue]\npath = \"a.csv\"\n[models]\nnames = [\"lcdm\"]\n[report]\n";

    private static StudyDefinition Parse(string report) => StudyFileParser.Parse(Head + report, "s.toml", "/data");

    [Theory]
    // Widths: common practice, a journal single column is about 3.3 in and a double column about 7 in.
    [InlineData("figure_width = \"single-column\"\n", 3.3)]
    [InlineData("figure_width = \"double-column\"\n", 7.0)]
    [InlineData("figure_width = 4.5\n", 4.5)]
    [InlineData("figure_width = 5\n", 5.0)]
    public void FigureWidthTakesTheTwoNamesOrInches(string line, double inches)
    {
        var s = Parse(line);
        Assert.Equal(inches, s.Report.FigureWidth!.Value.Inches);
    }

    [Fact]
    public void NoFigureWidthKeepsEachFiguresOwnSize() => Assert.Null(Parse("title = \"t\"\n").Report.FigureWidth);

    [Theory]
    [InlineData("figure_width = \"triple-column\"\n")]
    [InlineData("figure_width = 0.2\n")]
    [InlineData("figure_width = true\n")]
    public void BadFigureWidthNamesLineAndColumn(string line)
    {
        var e = Assert.Throws<InputException>(() => Parse(line));
        Assert.Contains("figure_width", e.Message);
        Assert.Contains("single-column", e.Message);
        Assert.Equal(6L, e.Line); // the [report] key is on line 6 of the text
        Assert.NotNull(e.Column);
    }
}

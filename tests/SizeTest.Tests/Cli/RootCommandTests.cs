using Xunit;

namespace SizeTest.Tests.Cli;

public sealed class RootCommandTests
{
    [Fact]
    public void UnknownVerbIsBadUsageWithOneLineMessage()
    {
        var (exit, _, err) = CliRunner.Run("no-such-verb");
        Assert.Equal(2, exit);
        Assert.Single(err.Trim().Split('\n'));
    }

    [Fact]
    public void HelpSucceeds()
    {
        var (exit, output, _) = CliRunner.Run("--help");
        Assert.Equal(0, exit);
        Assert.Contains("SizeTest", output);
    }
}

public sealed class ParseErrorMessageTests
{
    [Fact]
    public void BadFormatValueGivesOneLine()
    {
        // The value list of --format spans several lines in System.CommandLine's own message; we fold it.
        var (exit, _, err) = CliRunner.Run("predict", "--z", "1", "--format", "xml");
        Assert.Equal(2, exit);
        Assert.Single(err.Trim().Split('\n'));
    }
}

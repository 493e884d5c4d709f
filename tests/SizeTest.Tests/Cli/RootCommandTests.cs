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

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
    public void MistypedVerbAndOptionGetADidYouMean()
    {
        // 'fitt' is one Damerau–Levenshtein edit from 'fit'; 'modle' one (a transposition) from 'model' (NameSuggestionsTests).
        var (exit, _, err) = CliRunner.Run("fitt");
        Assert.Equal(2, exit);
        Assert.Contains("did you mean 'fit'?", err);
        var (exit2, _, err2) = CliRunner.Run("predict", "--z", "1", "--modle", "lcdm");
        Assert.Equal(2, exit2);
        Assert.Contains("did you mean '--model'?", err2);
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

using SizeTest.Foundation.Text;
using SizeTest.Tests.Catalogues;
using Xunit;

namespace SizeTest.Tests.Cli.Hardening;

/// <summary>Issue 14 point 10: terminal escape sequences from a file's header never reach the terminal raw.</summary>
public sealed class TerminalEscapeTests
{
    [Fact]
    public void EscapeShowsControlCharactersAsUnicodeEscapes()
    {
        Assert.Equal("a\\u001b[31mb", TerminalText.Escape("a\u001b[31mb"));
        Assert.Equal("x\\u0007y\\u009bz\\u202e", TerminalText.Escape("x\u0007y\u009bz\u202e"));
        Assert.Equal(@"C:\data\θ (mas)", TerminalText.Escape(@"C:\data\θ (mas)")); // ordinary text untouched
    }

    [Fact]
    public void InspectTableEscapesAHostileHeaderName()
    {
        using var t = new TempFiles();
        var cat = t.Write("c.csv", "z,theta,\u001b]0;pwned\u0007\u001b[2J\n0.5,1,3\n0.7,2,4\n");
        var (exit, output, err) = CliRunner.Run("inspect", cat);
        Assert.Equal(0, exit);
        Assert.DoesNotContain('\u001b', output + err);
        Assert.DoesNotContain('\u0007', output + err);
        Assert.Contains("\\u001b]0;pwned\\u0007\\u001b[2J", output);
    }

    [Fact]
    public void ErrorMessageEscapesAHostileColumnName()
    {
        using var t = new TempFiles();
        var cat = t.Write("c.csv", "z,theta\n0.5,1\n");
        var (exit, _, err) = CliRunner.Run("inspect", cat, "--col", "theta=\u001b[31mred");
        Assert.Equal(2, exit);
        Assert.DoesNotContain('\u001b', err);
        Assert.Contains("\\u001b[31mred", err);
    }
}

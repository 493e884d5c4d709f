using SizeTest.Cli;
using SizeTest.Foundation.Errors;
using Xunit;

namespace SizeTest.Tests.Cli.Hardening;

/// <summary>Issue 14 point 10: <c>--z 0:1:1e-300</c> said it "needs a positive step" (1e-300 rounds to a decimal 0).</summary>
public sealed class RedshiftStepTests
{
    [Theory]
    [InlineData("0:1:1e-300")]
    [InlineData("0:1000:1e-28")] // (stop - start) / step = 1e31 would overflow decimal arithmetic
    [InlineData("0:1:1e-7")]
    public void ATinyPositiveStepIsTooManyRedshiftsNotANonPositiveStep(string range)
    {
        var ex = Assert.Throws<InputException>(() => RedshiftList.Parse(range));
        Assert.Contains("gives too many redshifts", ex.Message);
        Assert.Contains($"at most {RedshiftList.MaxCount} are allowed", ex.Message);
        Assert.DoesNotContain("positive step", ex.Message);
    }

    [Fact]
    public void PredictExitsTwoWithTheLimit()
    {
        var (exit, _, err) = CliRunner.Run("predict", "--z", "0:1:1e-300");
        Assert.Equal(2, exit);
        Assert.Contains("--z range '0:1:1e-300': the step 1e-300 gives too many redshifts", err);
        Assert.Contains("at most 1000000 are allowed", err);
    }

    [Fact]
    public void ZeroAndNegativeStepsStillNeedAPositiveStep()
    {
        Assert.Contains("needs a positive step", Assert.Throws<InputException>(() => RedshiftList.Parse("0:1:0")).Message);
        Assert.Contains("needs a positive step", Assert.Throws<InputException>(() => RedshiftList.Parse("0:1:-1e-300")).Message);
        Assert.Equal([0.5], RedshiftList.Parse("0.5:0.5:1e-300")); // a single point, whatever the step
    }
}

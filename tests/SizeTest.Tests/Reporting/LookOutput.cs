using SizeTest.Reporting;
using SizeTest.Reporting.Pack;
using Xunit;

namespace SizeTest.Tests.Reporting;

/// <summary>Writes a full synthetic report folder when SIZETEST_LOOK_DIR is set (for looking at the output by eye); otherwise does nothing.</summary>
public sealed class LookOutput
{
    [Fact]
    public void WritesAReportToLookAtWhenAsked()
    {
        var dir = Environment.GetEnvironmentVariable("SIZETEST_LOOK_DIR");
        if (string.IsNullOrEmpty(dir)) return;
        new ReportPackWriter().Write(Path.Combine(dir, "sparse"), true, ReportContent.From(SyntheticReport.Create()));
        new ReportPackWriter().Write(Path.Combine(dir, "dense"), true, ReportContent.From(SyntheticReport.Create(5000, seed: 3)));
    }
}

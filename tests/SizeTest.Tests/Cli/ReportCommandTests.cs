using SizeTest.Reporting;
using SizeTest.Reporting.Data;
using SizeTest.Reporting.Pack;
using SizeTest.Tests.Reporting;
using Xunit;

namespace SizeTest.Tests.Cli;

public sealed class ReportCommandTests
{
    private static readonly ReportPackOptions Light = new() { Png = false, Pdf = false, PdfReport = false };

    private static string MakeRun(DirectoryInfo root)
    {
        var dir = Path.Combine(root.FullName, "run");
        var data = SyntheticReport.Create(80, seed: 4, posterior: false, power: false);
        new ReportPackWriter(Light).Write(dir, false, ReportContent.From(data), f =>
        {
            File.WriteAllText(f.PathOf("results.json"), "{\"models\": []}\n");
        });
        return dir;
    }

    [Fact]
    public void RedrawsInPlaceKeepingResultsAndWithoutRefitting()
    {
        var root = Directory.CreateTempSubdirectory("sizetest-report-");
        try
        {
            var dir = MakeRun(root);
            File.Delete(Path.Combine(dir, "report.html"));
            var (exit, output, err) = CliRunner.Run("report", dir);
            Assert.True(exit == 0, err);
            Assert.Contains("wrote", output);
            Assert.True(File.Exists(Path.Combine(dir, "report.html")));
            Assert.True(File.Exists(Path.Combine(dir, "report.pdf")));
            Assert.True(File.Exists(Path.Combine(dir, "figures", "angular-size.png")));
            Assert.Equal("{\"models\": []}\n", File.ReadAllText(Path.Combine(dir, "results.json")));
        }
        finally { root.Delete(true); }
    }

    [Fact]
    public void OutFolderFollowsTheForceRule()
    {
        var root = Directory.CreateTempSubdirectory("sizetest-report-out-");
        try
        {
            var dir = MakeRun(root);
            var other = Path.Combine(root.FullName, "other");
            Directory.CreateDirectory(other);
            File.WriteAllText(Path.Combine(other, "keep.txt"), "x");
            var (exit, _, err) = CliRunner.Run("report", dir, "--out", other, "--paper", "letter");
            Assert.Equal(2, exit);
            Assert.Contains("--force", err);
            Assert.True(File.Exists(Path.Combine(other, "keep.txt")));
            // --force replaces only a folder sizetest wrote (issue 14): a user's file is never deleted.
            (exit, _, err) = CliRunner.Run("report", dir, "--out", other, "--paper", "letter", "--force");
            Assert.Equal(2, exit);
            Assert.Contains("not written by sizetest", err);
            Assert.True(File.Exists(Path.Combine(other, "keep.txt")));
            File.Delete(Path.Combine(other, "keep.txt"));
            (exit, _, err) = CliRunner.Run("report", dir, "--out", other, "--paper", "letter");
            Assert.True(exit == 0, err);
            (exit, _, err) = CliRunner.Run("report", dir, "--out", other, "--paper", "letter", "--force");
            Assert.True(exit == 0, err);
            Assert.True(File.Exists(Path.Combine(other, ReportDataJson.FileName))); // the copy can be redrawn again
        }
        finally { root.Delete(true); }
    }

    [Fact]
    public void HelpNamesTheOptions()
    {
        var (exit, output, _) = CliRunner.Run("report", "--help");
        Assert.Equal(0, exit);
        foreach (var o in new[] { "--out", "--paper", "--force", "DIR" }) Assert.Contains(o, output);
    }

    [Fact]
    public void MissingOrBrokenDataIsBadInput()
    {
        var root = Directory.CreateTempSubdirectory("sizetest-report-bad-");
        try
        {
            var (exit, _, err) = CliRunner.Run("report", Path.Combine(root.FullName, "nope"));
            Assert.Equal(2, exit);
            Assert.Single(err.Trim().Split('\n'), l => !l.StartsWith("sizetest: redrawing", StringComparison.Ordinal));
            File.WriteAllText(Path.Combine(root.FullName, ReportDataJson.FileName), "{ not json");
            (exit, _, err) = CliRunner.Run("report", root.FullName);
            Assert.Equal(2, exit);
            Assert.Contains("report-data.json", err);
            Assert.Contains("line", err);
        }
        finally { root.Delete(true); }
    }
}

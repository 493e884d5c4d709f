using SizeTest.Tests.Studies;
using Xunit;

namespace SizeTest.Tests.Cli.Studies;

/// <summary>
/// A study run's errors from the inner stages (photometry options, the reader, the selection check) name the setting as the
/// study file spells it — the key the author wrote — never as a command-line flag the study file has no use for; run's own
/// flags (<c>--out</c>, <c>--force</c>) keep theirs.
/// </summary>
public sealed class StudyRunMessageTests
{
    [Theory]
    // An unknown K-correction form.
    [InlineData("kcorr = \"bogus\"", "corrections.kcorr 'bogus'", "--kcorr")]
    // min_size far above the mock's smallest sizes: more than 5 % of the objects lie below it.
    [InlineData("min_size = 0.5", "raise selection.max_outside_fraction", "--max-outside-selection")]
    // A table number for a text catalogue, which has one table.
    [InlineData("table = 2", "drop catalogue.table '2'", "--hdu")]
    public void InnerStageErrorsNameTheStudyKey(string line, string expected, string flag)
    {
        using var fx = new StudyFixture();
        string table = line.StartsWith("kcorr", StringComparison.Ordinal) ? "[corrections]" : line.StartsWith("min_size", StringComparison.Ordinal) ? "[selection]" : "[catalogue]";
        string text = File.ReadAllText(fx.StudyPath);
        File.WriteAllText(fx.StudyPath, table == "[catalogue]"
            ? text.Replace("path = \"mock.csv\"", "path = \"mock.csv\"\n" + line, StringComparison.Ordinal)
            : text + $"\n{table}\n{line}\n");
        var (exit, _, stderr) = CliRunner.Run("run", fx.StudyPath, "--out", fx.Out());
        Assert.Equal(2, exit);
        Assert.Contains(expected, stderr);
        Assert.DoesNotContain(flag, stderr);
        Assert.False(Directory.Exists(fx.Out()));

        // run's own flags keep their spelling: an existing folder is refused naming --force.
        Directory.CreateDirectory(fx.Out());
        File.WriteAllText(Path.Combine(fx.Out(), "keep.txt"), "old");
        var (exit2, _, stderr2) = CliRunner.Run("run", fx.StudyPath, "--out", fx.Out());
        Assert.Equal(2, exit2);
        Assert.Contains("--force", stderr2);
    }
}

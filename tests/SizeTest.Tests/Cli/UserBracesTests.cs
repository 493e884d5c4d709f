using System.Globalization;
using System.Text;
using System.Text.Json;
using SizeTest.Foundation.Errors;
using SizeTest.Tests.Catalogues;
using SizeTest.Tests.Studies;
using Xunit;

namespace SizeTest.Tests.Cli;

/// <summary>
/// A user's value (a column name, a path, a group label) that reads like a setting placeholder (<c>{out}</c>) is shown as
/// it is in a message that names settings, on the command line and in a study: only the library's own placeholders are
/// spelled as flags or keys. The escape is the common practice of composite format strings (a doubled brace is a literal
/// brace, as in .NET's String.Format).
/// </summary>
public sealed class UserBracesTests : IDisposable
{
    private readonly TempFiles _t = new();

    public void Dispose() => _t.Dispose();

    [Fact]
    public void InsertedValuesAreEscapedAndOnlyTheTemplatesPlaceholdersRender()
    {
        string path = "/data/{out}/x";
        var p = new SettingProblem($"output folder '{path}' exists; choose another {{out}}");
        Assert.Equal(["out"], p.Settings);
        Assert.Equal("output folder '/data/{out}/x' exists; choose another --out", p.Render(s => "--" + s));
        Assert.Equal("output folder '/data/{out}/x' exists; choose another out", p.ToString());   // the library's own reading: setting names
        // A placeholder made on purpose stays a placeholder; an escaped brace next to it is text.
        Assert.Equal("{--walkers}", SettingProblem.RenderText(SettingProblem.Literal("{") + SettingProblem.Name("walkers") + "}", s => "--" + s));
        Assert.Equal("x = 1.5 --steps", SettingProblem.Text($"x = {1.5.ToString(CultureInfo.InvariantCulture)} {SettingProblem.Name("steps")}") is var t ? SettingProblem.RenderText(t, s => "--" + s) : "");
    }

    private string BracesCatalogue()
    {
        // No redshift column: the loader refuses it, listing the columns (exit 2).
        return _t.Write("braces.csv", "{out},theta,{seed}\n1.0,2.0,a\n1.5,2.5,b\n");
    }

    [Fact]
    public void ACommandLineErrorShowsAColumnNamedLikeAFlagLiterally()
    {
        var (code, _, err) = CliRunner.Run("inspect", BracesCatalogue());
        Assert.Equal(2, code);
        Assert.Contains("map one with --col z=NAME", err, StringComparison.Ordinal);
        Assert.Contains("the columns are '{out}', 'theta', '{seed}'", err, StringComparison.Ordinal);
        Assert.DoesNotContain("'--out'", err, StringComparison.Ordinal);
    }

    [Fact]
    public void AStudyErrorShowsAColumnNamedLikeAFlagLiterally()
    {
        using var fx = new StudyFixture(n: 40);
        File.Copy(BracesCatalogue(), Path.Combine(fx.Dir, "mock.csv"), overwrite: true);
        var (code, _, err) = CliRunner.Run("run", fx.StudyPath, "--out", fx.Out());
        Assert.Equal(2, code);
        Assert.Contains("the columns are '{out}', 'theta', '{seed}'", err, StringComparison.Ordinal);
    }

    [Fact]
    public void AStudyReportNamesAColumnNamedLikeAKeyAsItIs()
    {
        // The size column renamed {seed} and mapped by [columns]: the report's mapping assumption shows the name as it is
        // and the library's {col} as the study's [columns].
        using var fx = new StudyFixture(n: 120, extra: "[columns]\ntheta = \"{seed}\"\n");
        var csv = Path.Combine(fx.Dir, "mock.csv");
        var lines = File.ReadAllLines(csv);
        var header = lines[0].Split(',');
        Assert.Contains("theta", header);
        lines[0] = string.Join(",", header.Select(h => h == "theta" ? "{seed}" : h));
        File.WriteAllLines(csv, lines);
        var (code, _, err) = CliRunner.Run("run", fx.StudyPath, "--out", fx.Out());
        Assert.True(code == 0, err);
        var data = SizeTest.Reporting.Data.ReportDataJson.Load(Path.Combine(fx.Out(), "report-data.json"));
        var mapping = data.Assumptions.Single(a => a.Topic == "size definition").Statement;
        Assert.Contains("theta ← {seed}", mapping, StringComparison.Ordinal); // prose: console padding collapsed (ProseText.Collapse)
        Assert.Contains("given with [columns]", mapping, StringComparison.Ordinal);
    }

    [Fact]
    public void AnOutputPathAndAGroupLabelNamedLikeSettingsStayText()
    {
        // An output folder whose name reads {force}, existing and not empty: refused naming the folder as given.
        string dir = _t.PathOf("{force}");
        Directory.CreateDirectory(dir);
        File.WriteAllText(Path.Combine(dir, "keep.txt"), "old");
        var sb = new StringBuilder("z,theta,group\n");
        for (int i = 0; i < 40; i++)
            sb.Append(CultureInfo.InvariantCulture, $"{0.2 + 0.045 * i:F3},{1.2 - 0.01 * i + 0.05 * (i % 3):F3},{{seed}}\n");
        var csv = _t.Write("one-group.csv", sb.ToString());
        var (code, _, err) = CliRunner.Run("fit", csv, "--models", "lcdm", "--cv-folds", "0", "--starts", "1", "--out", dir);
        Assert.Equal(2, code);
        Assert.Contains($"output folder '{dir}' already exists and is not empty; pass --force", err, StringComparison.Ordinal);

        // One group label, {seed}: fitted as one population, and the note names the label as it is.
        string outDir = _t.PathOf("fit");
        var (fcode, _, ferr) = CliRunner.Run("fit", csv, "--models", "lcdm", "--cv-folds", "0", "--starts", "1", "--out", outDir, "--group", "group");
        Assert.True(fcode == 0, ferr);
        using var doc = JsonDocument.Parse(File.ReadAllText(Path.Combine(outDir, "results.json")));
        var notes = doc.RootElement.GetProperty("notes").EnumerateArray().Select(n => n.GetString()!).ToArray();
        Assert.Contains(notes, n => n.Contains("--group: the group column has a single label '{seed}'", StringComparison.Ordinal));
    }
}

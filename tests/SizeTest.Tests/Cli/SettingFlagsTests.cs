using System.CommandLine;
using System.Text.RegularExpressions;
using SizeTest.Cli;
using SizeTest.Tests.Architecture;
using Xunit;

namespace SizeTest.Tests.Cli;

/// <summary>
/// The settings the library names in its messages (<c>{walkers}</c>, <see cref="SizeTest.Foundation.Errors.SettingProblem"/>)
/// are spelt by the CLI as flags (<see cref="SettingFlags"/>): each placeholder written in a string literal of src/SizeTest
/// must become a flag that some verb really has, so a misspelt placeholder cannot reach a user as a flag that does not exist.
/// </summary>
public sealed partial class SettingFlagsTests
{
    [GeneratedRegex(@"\{\{([a-z][a-z0-9_]*)\}\}")]
    private static partial Regex InterpolatedPlaceholder();

    [GeneratedRegex(@"\{([a-z][a-z0-9_]*)\}")]
    private static partial Regex PlainPlaceholder();

    /// <summary>Files whose plain strings hold braces that are no settings (LaTeX environments).</summary>
    private static readonly string[] NotSettingBraces = ["Reporting/Tables/TableFormats.cs"];

    /// <summary>The settings named in the string literals of <paramref name="source"/>: <c>{{name}}</c> in an interpolated
    /// string, <c>{name}</c> in a plain one (an interpolation hole of a <c>$"…"</c> string, with any strings nested in it, is
    /// code, not text). Comment lines are skipped.</summary>
    internal static IEnumerable<string> NamedSettings(string source) =>
        from l in VocabularyTests.CodeLines(source)
        from lit in Literals(l.Text)
        from Match p in (lit.Interpolated ? InterpolatedPlaceholder() : PlainPlaceholder()).Matches(lit.Text)
        select p.Groups[1].Value;

    /// <summary>The text of each regular or interpolated string literal on <paramref name="line"/> (holes left out).</summary>
    internal static IEnumerable<(bool Interpolated, string Text)> Literals(string line)
    {
        for (int i = 0; i < line.Length;)
        {
            if (line[i] == '\'') { i = line.IndexOf('\'', i + (line[i + 1] == '\\' ? 3 : 2)) + 1; if (i == 0) yield break; continue; }
            bool interpolated = line[i] == '$' && i + 1 < line.Length && line[i + 1] == '"';
            if (line[i] != '"' && !interpolated) { i++; continue; }
            var text = new System.Text.StringBuilder();
            i = ReadString(line, i + (interpolated ? 2 : 1), interpolated, text);
            yield return (interpolated, text.ToString());
        }
    }

    /// <summary>Reads a string body from <paramref name="i"/> to its closing quote into <paramref name="text"/>; returns the
    /// index after the quote.</summary>
    private static int ReadString(string line, int i, bool interpolated, System.Text.StringBuilder text)
    {
        while (i < line.Length)
        {
            char c = line[i];
            if (c == '\\') { text.Append(line, i, Math.Min(2, line.Length - i)); i += 2; continue; }
            if (c == '"') return i + 1;
            if (interpolated && (c == '{' || c == '}') && i + 1 < line.Length && line[i + 1] == c) { text.Append(c).Append(c); i += 2; continue; }
            if (interpolated && c == '{')
            {
                for (int depth = 1, j = i + 1; ; j++)
                {
                    if (j >= line.Length) return j;
                    bool nested = line[j] == '"' || (line[j] == '$' && j + 1 < line.Length && line[j + 1] == '"');
                    if (nested) { bool ni = line[j] == '$'; j = ReadString(line, j + (ni ? 2 : 1), ni, new System.Text.StringBuilder()) - 1; continue; }
                    if (line[j] == '{') depth++;
                    else if (line[j] == '}' && --depth == 0) { i = j + 1; break; }
                }
                text.Append('\u0001');
                continue;
            }
            text.Append(c);
            i++;
        }
        return i;
    }

    private static IEnumerable<string> Flags(Command command) =>
        command.Options.SelectMany(o => new[] { o.Name }.Concat(o.Aliases)).Concat(command.Subcommands.SelectMany(Flags));

    [Fact]
    public void EverySettingTheLibraryNamesIsAFlagOfSomeVerb()
    {
        var flags = Flags(Program.BuildRoot(new CliContext(TextWriter.Null, TextWriter.Null, false))).ToHashSet(StringComparer.Ordinal);
        string root = LayeringTests.SourceRoot();   // src/SizeTest
        var named = Directory.EnumerateFiles(root, "*.cs", SearchOption.AllDirectories)
            .Select(f => (Path: f, Relative: Path.GetRelativePath(root, f).Replace('\\', '/')))
            .Where(f => !f.Relative.StartsWith("obj/", StringComparison.Ordinal) && !NotSettingBraces.Contains(f.Relative))
            .SelectMany(f => NamedSettings(File.ReadAllText(f.Path)).Select(s => (File: f.Relative, Setting: s)))
            .ToList();
        // The scan sees the library's messages (a few known settings, from OutputFolder, MappingResolver, SelectionConsistency, MockSurveyGenerator).
        foreach (var known in new[] { "out", "force", "col", "max_outside_selection", "object_count" })
            Assert.Contains(known, named.Select(x => x.Setting));
        var unknown = named
            .Where(x => !flags.Contains(SettingFlags.Flag(x.Setting)))
            .Select(x => $"{x.File}: {{{x.Setting}}} → {SettingFlags.Flag(x.Setting)}")
            .Distinct()
            .ToList();
        Assert.True(unknown.Count == 0, "settings named by the library that are no CLI flag:\n" + string.Join("\n", unknown));
    }

    [Fact]
    public void TheFinderReadsPlaceholdersAndSkipsInterpolationHoles()
    {
        // A test of the test: {{walkers}} in $"…" and {out} in "…" are settings; {spec} and a hole holding a nested string
        // are code; {{{option}}} is a setting held in a variable; comments are skipped.
        const string code = """
            // {force} in a comment
            throw SettingProblem.Input($"{{walkers}} must be at least 4; got '{spec}' ({Pct(f, "0.#")}) {detail} {{free}}");
            notes.Add("choose another {out}" + $"{{{option}}}");
            """;
        Assert.Equal(["walkers", "free", "out"], NamedSettings(code).ToArray());
    }
}

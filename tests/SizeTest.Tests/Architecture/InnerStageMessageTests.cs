using System.Text.RegularExpressions;
using Xunit;

namespace SizeTest.Tests.Architecture;

/// <summary>
/// Messages in the wrong layer (issue 15): a text the library hands to a user — an error, a note, a warning, the reason
/// a column was chosen — names a setting as <c>{name}</c> (<see cref="SizeTest.Foundation.Errors.SettingProblem"/>), and
/// the front end spells it (the CLI's flags in <c>SettingFlags</c>, a study's keys in <c>StudySettingKeys</c>). No string
/// literal in src/SizeTest may therefore contain a command-line flag (<c>--name</c>); doc comments and <c>//</c> comments may.
/// </summary>
public sealed partial class InnerStageMessageTests
{
    /// <summary>Folders not yet covered (none: <c>Inference/Survey/</c> is covered since its rewrite landed).</summary>
    private static readonly string[] NotYetCovered = [];

    /// <summary>Literals that may name a flag, each with its reason.</summary>
    private static readonly (string File, string Literal, string Why)[] Allowed =
    [
        ("Foundation/Files/OutputFolder.cs", "'sizetest --force' replaces only these",
            "the first line of the marker file in an output folder: the file says which command replaces it, it is no message of a stage"),
    ];

    [GeneratedRegex("\"((?:[^\"\\\\]|\\\\.)*)\"")]
    private static partial Regex StringLiteral();

    [GeneratedRegex(@"(?<![\w'-])--[a-z][a-z0-9-]*")]
    private static partial Regex Flag();

    /// <summary>The (1-based line, flag, literal) of each flag inside a string literal of <paramref name="source"/>; comment
    /// lines are skipped. (A literal interrupted by a nested literal of an interpolation is checked in its pieces.)</summary>
    internal static List<(int Line, string Flag, string Literal)> FlagsInLiterals(string source) =>
        [.. from l in VocabularyTests.CodeLines(source)
            from Match lit in StringLiteral().Matches(l.Text)
            from Match f in Flag().Matches(lit.Groups[1].Value)
            select (l.Line, f.Value, lit.Groups[1].Value)];

    [Fact]
    public void NoLibraryStringNamesACommandLineFlag()
    {
        string root = LayeringTests.SourceRoot();   // src/SizeTest
        var bad = new List<string>();
        foreach (var file in Directory.EnumerateFiles(root, "*.cs", SearchOption.AllDirectories))
        {
            string rel = Path.GetRelativePath(root, file).Replace('\\', '/');
            if (rel.StartsWith("obj/", StringComparison.Ordinal) || rel.StartsWith("bin/", StringComparison.Ordinal)) continue;
            if (NotYetCovered.Any(f => rel.StartsWith(f, StringComparison.Ordinal))) continue;
            foreach (var (line, flag, literal) in FlagsInLiterals(File.ReadAllText(file)))
                if (!Allowed.Any(a => a.File == rel && literal.Contains(a.Literal, StringComparison.Ordinal)))
                    bad.Add($"{rel}:{line}: {flag}");
        }
        Assert.True(bad.Count == 0, "inner-stage texts name CLI flags; write the setting as {name} (SettingProblem) and let the CLI spell it (SettingFlags):\n" + string.Join("\n", bad));
    }

    /// <summary>The test of the test: a flag in a message is found, in an interpolated string too; the same word in a doc
    /// comment, a <c>//</c> comment, a placeholder or an arrow (<c>--&gt;</c>) is not.</summary>
    [Fact]
    public void TheScanFindsAFlagInAMessageAndNotInAComment()
    {
        const string source = """
            /// <summary>Callers check <c>--force</c>.</summary>
            // the CLI maps {out} to --out
            throw new InputException("pass --force to replace it");
            throw SettingProblem.Input($"choose another {{out}} than '{path}' (x --> y)");
            throw new ArgumentException($"{Pct(f, "0.#")} outside; raise --max-outside-selection");
            """;
        var found = FlagsInLiterals(source);
        Assert.Equal([(3, "--force"), (5, "--max-outside-selection")], found.Select(f => (f.Line, f.Flag)).ToArray());
    }
}

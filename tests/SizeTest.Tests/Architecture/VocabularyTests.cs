using System.Reflection;
using System.Text.RegularExpressions;
using SizeTest.Cosmology;
using SizeTest.Inference;
using Xunit;

namespace SizeTest.Tests.Architecture;

/// <summary>
/// One vocabulary (issue 15): a parameter name is written once, in its spec (<see cref="NuisanceParameters"/>,
/// <see cref="WorldModelParameters"/>); everywhere else in src/ it is read from the spec's <c>Names</c> constants.
/// </summary>
public sealed partial class VocabularyTests
{
    /// <summary>Files that may spell parameter names: the two spec files, and the column-alias table of the catalogue
    /// mapper, where <c>mu0</c> is a catalogue column name (Catalogues may not see Inference).</summary>
    private static readonly string[] Allowed =
    [
        "SizeTest/Inference/NuisanceParameters.cs",
        "SizeTest/Cosmology/WorldModelParameters.cs",
        "SizeTest/Catalogues/MappingResolver.cs",
    ];

    /// <summary>Every parameter name the specs declare (their <c>Names</c> constants).</summary>
    internal static IReadOnlySet<string> ParameterNames { get; } =
        new[] { typeof(NuisanceParameters.Names), typeof(WorldModelParameters.Names) }
            .SelectMany(t => t.GetFields(BindingFlags.Public | BindingFlags.Static))
            .Where(f => f.IsLiteral && f.FieldType == typeof(string))
            .Select(f => (string)f.GetRawConstantValue()!)
            .ToHashSet(StringComparer.Ordinal);

    [GeneratedRegex("\"((?:[^\"\\\\]|\\\\.)*)\"")]
    private static partial Regex StringLiteral();

    /// <summary>The (1-based line, name) of each string literal in <paramref name="source"/> that is exactly a parameter
    /// name; comment lines (<c>//</c>, <c>///</c>) are skipped.</summary>
    internal static List<(int Line, string Name)> ParameterNameLiterals(string source) =>
        [.. from l in CodeLines(source)
            from Match m in StringLiteral().Matches(l.Text)
            where ParameterNames.Contains(m.Groups[1].Value)
            select (l.Line, m.Groups[1].Value)];

    /// <summary>The (1-based number, text) of each line of <paramref name="source"/> that is not a comment line (<c>//</c>, <c>///</c>).</summary>
    internal static IEnumerable<(int Line, string Text)> CodeLines(string source) =>
        source.Split('\n').Select((text, i) => (i + 1, text)).Where(l => !l.text.TrimStart().StartsWith("//", StringComparison.Ordinal));

    private static IEnumerable<(string Relative, string Text)> SourceFiles()
    {
        string root = Path.GetDirectoryName(LayeringTests.SourceRoot())!;   // src/
        foreach (var file in Directory.EnumerateFiles(root, "*.cs", SearchOption.AllDirectories))
        {
            string rel = Path.GetRelativePath(root, file).Replace('\\', '/');
            if (rel.Contains("/obj/", StringComparison.Ordinal) || rel.Contains("/bin/", StringComparison.Ordinal)) continue;
            yield return (rel, File.ReadAllText(file));
        }
    }

    [Fact]
    public void TheSpecsDeclareTheNamesOfResultsJson()
    {
        // The names that results.json, study files and --fix/--free use (docs/results-schema.md): a few as anchors.
        foreach (var n in new[] { "h0", "omega_m", "r0_kpc", "size_evolution", "sb_evolution", "scatter_dex", "mu0" })
            Assert.Contains(n, ParameterNames);
        Assert.Equal(NuisanceParameters.Names.SizeEvolution, NuisanceParameters.SizeEvolution.Name);
        Assert.Equal(WorldModelParameters.Names.OmegaMatter, WorldModelParameters.OmegaMatter.Name);
    }

    [Fact]
    public void NoParameterNameLiteralOutsideTheSpecs()
    {
        var offenders = SourceFiles()
            .Where(f => !Allowed.Contains(f.Relative))
            .SelectMany(f => ParameterNameLiterals(f.Text).Select(x => $"{f.Relative}:{x.Line} \"{x.Name}\""))
            .ToList();
        Assert.True(offenders.Count == 0, "parameter names spelt outside their specs (use NuisanceParameters.Names / WorldModelParameters.Names):\n" + string.Join("\n", offenders));
    }

    [Fact]
    public void TheLiteralFinderCatchesANameAndSkipsCommentsAndLongerWords()
    {
        // A test of the test: the finder must see a bare literal, and nothing in comments or in longer words.
        const string code = """
            /// <param name="h0">Hubble constant.</param>
            // "size_evolution" in a comment
            var a = p.Name == "size_evolution" ? 1 : 0;
            var b = "r0_kpc_bin1" + "h0x";
            Write(w, "mu0", "a \" quote");
            """;
        var found = ParameterNameLiterals(code);
        Assert.Equal([(3, "size_evolution"), (5, "mu0")], found);
    }

    [GeneratedRegex("\"(?:[^\"\\\\]|\\\\.)*\"")]
    private static partial Regex AnyStringLiteral();

    [GeneratedRegex(@"\b\w*[Cc]atalog(?!ue)\w*\b")]
    private static partial Regex CatalogIdentifier();

    /// <summary>The (1-based line, word) of each identifier spelt "catalog" rather than "catalogue" in <paramref name="source"/>:
    /// string literals and comment lines are skipped (file formats and flags such as <c>--catalog-format</c> keep their text).</summary>
    internal static List<(int Line, string Word)> CatalogSpellings(string source) =>
        [.. from l in CodeLines(source)
            from Match m in CatalogIdentifier().Matches(AnyStringLiteral().Replace(l.Text, "\"\""))
            select (l.Line, m.Value)];

    [Fact]
    public void OneSpellingOfCatalogueInIdentifiers()
    {
        var offenders = SourceFiles()
            .SelectMany(f => CatalogSpellings(f.Text).Select(x => $"{f.Relative}:{x.Line} {x.Word}"))
            .ToList();
        Assert.True(offenders.Count == 0, "identifiers spelt 'catalog' (write catalogue):\n" + string.Join("\n", offenders));
    }

    [Fact]
    public void TheSpellingFinderSkipsStringsAndComments()
    {
        // A test of the test: an identifier is seen; a flag or file name in a string and a comment are not.
        const string code = """
            // the catalog in a comment
            var catalogFile = new Option<string?>("--catalog-format");
            var catalogue = Load("demo-catalogs/x.csv");
            """;
        Assert.Equal([(2, "catalogFile")], CatalogSpellings(code));
    }

    [GeneratedRegex(@"\bnew\s+(System\.)?Random\s*\(|\bRandom\.Shared\b|\bRandom\s+\w+\s*=\s*new\s*\(")]
    private static partial Regex RandomConstruction();

    /// <summary>The 1-based lines of <paramref name="source"/> that make a <see cref="Random"/> (comments skipped).</summary>
    internal static List<int> RandomConstructions(string source) =>
        CodeLines(source).Where(l => RandomConstruction().IsMatch(l.Text)).Select(l => l.Line).ToList();

    [Fact]
    public void OneSeededRandomSource()
    {
        // Foundation/Randomness/SeededRandom.cs is the only maker of System.Random streams; mocks use SimulationRandom.
        var offenders = SourceFiles()
            .Where(f => f.Relative != "SizeTest/Foundation/Randomness/SeededRandom.cs")
            .SelectMany(f => RandomConstructions(f.Text).Select(line => $"{f.Relative}:{line}"))
            .ToList();
        Assert.True(offenders.Count == 0, "a Random made outside SeededRandom (use SeededRandom.Create(seed)):\n" + string.Join("\n", offenders));
    }

    [Fact]
    public void TheRandomFinderCatchesEachSpelling()
    {
        // A test of the test: each way of making a generator is seen; comments and SeededRandom calls are not.
        const string code = """
            var a = new Random(seed);
            var b = new System.Random(1);
            var c = Random.Shared.Next();
            Random d = new(3);
            // new Random(seed) in a comment
            var e = SeededRandom.Create(seed);
            """;
        Assert.Equal([1, 2, 3, 4], RandomConstructions(code));
    }
}

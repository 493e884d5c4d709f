using System.CommandLine;
using SizeTest.Cosmology;
using SizeTest.Foundation.Errors;

namespace SizeTest.Cli;

/// <summary>
/// The options that choose the fitted world models and their parameters, shared by <c>fit</c> (also under
/// mpirun) and <c>power</c>: <c>--models</c>, <c>--fix NAME=VALUE</c> and <c>--free NAME</c>. Each verb words
/// their help for itself and adds them where its help lists them.
/// </summary>
internal sealed class CandidateModelOptions(string modelsDescription, string fixDescription, string freeDescription)
{
    /// <summary><c>--models</c>: comma-separated world-model names.</summary>
    public Option<string> Models { get; } = new("--models") { Description = modelsDescription, DefaultValueFactory = _ => "lcdm,eds,static-linear,tired-light" };

    /// <summary><c>--fix NAME=VALUE</c>, repeatable.</summary>
    public Option<string[]> Fix { get; } = new("--fix") { Description = fixDescription };

    /// <summary><c>--free NAME</c>, repeatable or comma-separated.</summary>
    public Option<string[]> Free { get; } = new("--free") { Description = freeDescription };

    /// <summary>The named families, each once, in the order given (empty when none is named).</summary>
    public IWorldModelFamily[] Families(ParseResult parse) =>
        FitOptionParsing.List([parse.GetValue(Models) ?? ""]).Distinct().Select(n =>
            WorldModels.TryGet(n, out var f) ? f : throw new InputException($"--models: unknown world model '{n}'; known models are {string.Join(", ", WorldModels.Names)}")).ToArray();

    /// <summary>The fixed values of <c>--fix</c>.</summary>
    public Dictionary<string, double> Fixed(ParseResult parse) => FitOptionParsing.Fixed(parse.GetValue(Fix));

    /// <summary>The names of <c>--free</c>.</summary>
    public HashSet<string> Freed(ParseResult parse) => FitOptionParsing.List(parse.GetValue(Free)).ToHashSet(StringComparer.Ordinal);
}

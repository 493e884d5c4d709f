using System.CommandLine;
using SizeTest.Cosmology;
using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Text;

namespace SizeTest.Cli;

/// <summary>
/// The options that choose the fitted world models and their parameters, shared by <c>fit</c> (also under
/// mpirun) and <c>power</c>: <c>--models</c>, <c>--fix NAME=VALUE</c>, <c>--free NAME</c> and <c>--flux-convention</c>
/// (the luminosity exponent of every static candidate). Each verb words their help for itself and adds them where its
/// help lists them; <c>power</c> shares its <c>--flux-convention</c> with the true model's (<paramref name="fluxConvention"/>).
/// </summary>
internal sealed class CandidateModelOptions(string modelsDescription, string fixDescription, string freeDescription, Option<string?>? fluxConvention = null)
{
    /// <summary><c>--models</c>: comma-separated world-model names.</summary>
    public Option<string> Models { get; } = new("--models") { Description = modelsDescription, DefaultValueFactory = _ => "lcdm,eds,static-linear,tired-light" };

    /// <summary><c>--fix NAME=VALUE</c>, repeatable.</summary>
    public Option<string[]> Fix { get; } = new("--fix") { Description = fixDescription };

    /// <summary><c>--free NAME</c>, repeatable or comma-separated.</summary>
    public Option<string[]> Free { get; } = new("--free") { Description = freeDescription };

    /// <summary><c>--flux-convention</c>: energy-loss or time-dilation for every static model.</summary>
    public Option<string?> FluxConvention { get; } = fluxConvention ?? WorldModelOptions.CreateFluxConvention(
        "Static models (static-linear, tired-light): 'energy-loss' (D_L = d(1+z)^0.5, default) or 'time-dilation' (D_L = d(1+z)); same as --fix luminosity_exponent=0.5 or 1.");

    /// <summary>The named families, each once, in the order given (empty when none is named).</summary>
    public IWorldModelFamily[] Families(ParseResult parse) =>
        FitOptionParsing.List([parse.GetValue(Models) ?? ""]).Distinct().Select(n =>
            WorldModels.TryGet(n, out var f) ? f : throw new InputException($"--models: unknown world model '{n}'{NameSuggestions.Hint(n, WorldModels.Names)}; known models are {string.Join(", ", WorldModels.Names)}")).ToArray();

    /// <summary>The fixed values of <c>--fix</c>.</summary>
    public Dictionary<string, double> Fixed(ParseResult parse) => FitOptionParsing.Fixed(parse.GetValue(Fix));

    /// <summary>The names of <c>--free</c>.</summary>
    public HashSet<string> Freed(ParseResult parse) => FitOptionParsing.List(parse.GetValue(Free)).ToHashSet(StringComparer.Ordinal);

    /// <summary>
    /// The luminosity exponent q that <c>--flux-convention</c> sets for every static model, or null when it is not given;
    /// refuses it when none of <paramref name="families"/> is static or when <paramref name="named"/> (the names given to
    /// --fix, --free, --prior or --bound) already sets <c>luminosity_exponent</c>.
    /// </summary>
    public double? ConventionExponent(ParseResult parse, IEnumerable<IWorldModelFamily> families, IEnumerable<string> named)
    {
        if (WorldModelOptions.Convention(parse, FluxConvention) is not { } convention) return null;
        if (FluxConventions.Unused(families, "models") is { } unused) throw SettingProblem.Exception([unused]);
        string q = WorldModelParameters.Names.LuminosityExponent;
        if (named.Contains(q, StringComparer.Ordinal))
            throw new InputException($"--flux-convention {convention.Name()} sets {q} = {convention.LuminosityExponent().ToString(System.Globalization.CultureInfo.InvariantCulture)} for every static model; give either it or {q} in --fix, --free, --prior or --bound, not both");
        return convention.LuminosityExponent();
    }
}

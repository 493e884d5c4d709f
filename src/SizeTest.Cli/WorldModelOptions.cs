using System.CommandLine;
using System.Globalization;
using SizeTest.Cosmology;
using SizeTest.Foundation.Text;

namespace SizeTest.Cli;

/// <summary>
/// The world-model options shared by verbs: <c>--model</c> and one option per parameter of any
/// family (<c>omega_m</c> → <c>--omega-m</c>), generated from the <see cref="ParameterSpec"/>s, plus
/// <c>--flux-convention</c> as a readable alias for the static models' luminosity exponent
/// (<see cref="FluxConventions"/>; <c>fit</c> and <c>power</c> also apply it to their static candidates, <see cref="CandidateModelOptions"/>).
/// Holds no physics: it only collects values and asks the family to build the model.
/// </summary>
internal sealed class WorldModelOptions
{
    private readonly List<(ParameterSpec Spec, Option<double?> Option)> _parameters = new();

    /// <summary>Creates the options (new instances for each command); <paramref name="fluxConventionDescription"/> words
    /// <c>--flux-convention</c>'s help where it does more than set <c>--model</c>'s exponent (power).</summary>
    public WorldModelOptions(string? fluxConventionDescription = null)
    {
        Model = new Option<string>("--model")
        {
            Description = $"World model: {string.Join(", ", WorldModels.Names)} (see 'sizetest models').",
            DefaultValueFactory = _ => "lcdm",
            HelpName = string.Join('|', WorldModels.Names),
        };
        // A validator rather than AcceptOnlyFromAmong: its message is one line.
        Model.Validators.Add(result =>
        {
            string? name = result.GetValueOrDefault<string>();
            if (name is null || !WorldModels.TryGet(name, out _))
                result.AddError($"Unknown world model '{name}' for --model{NameSuggestions.Hint(name ?? "", WorldModels.Names)}; known models are {string.Join(", ", WorldModels.Names)}.");
        });
        var seen = new HashSet<string>();
        foreach (var family in WorldModels.All)
            foreach (var spec in family.Parameters)
            {
                if (!seen.Add(spec.Name)) continue;
                string unit = spec.Unit.Length > 0 ? $" [{spec.Unit}]" : "";
                string def = spec.DefaultIsDerived ? "derived" : spec.Default.ToString("G", CultureInfo.InvariantCulture);
                var option = new Option<double?>(OptionName(spec.Name))
                {
                    Description = $"{spec.Description}{unit} (default {def}; models: {string.Join(", ", WorldModels.All.Where(f => f.Parameters.Any(p => p.Name == spec.Name)).Select(f => f.Name))}).",
                    CustomParser = NumberParser,
                };
                _parameters.Add((spec, option));
            }
        FluxConvention = CreateFluxConvention(fluxConventionDescription ??
            "Static models: 'energy-loss' (D_L = d(1+z)^0.5, default) or 'time-dilation' (D_L = d(1+z)); same as --luminosity-exponent 0.5 or 1.");
    }

    /// <summary>
    /// A <c>--flux-convention</c> option (energy-loss|time-dilation) with <paramref name="description"/>; its value is read with
    /// <see cref="Convention(ParseResult, Option{string?})"/>.
    /// </summary>
    public static Option<string?> CreateFluxConvention(string description)
    {
        var option = new Option<string?>("--flux-convention") { Description = description, HelpName = string.Join('|', FluxConventions.Names) };
        option.Validators.Add(result =>
        {
            string? value = result.GetValueOrDefault<string?>();
            if (!FluxConventions.TryParse(value, out _))
                result.AddError($"--flux-convention must be {string.Join(" or ", FluxConventions.Names)}; got '{value}'{NameSuggestions.Hint(value ?? "", FluxConventions.Names)}.");
        });
        return option;
    }

    /// <summary>The convention given with <paramref name="option"/>, or null.</summary>
    public static FluxConvention? Convention(ParseResult parse, Option<string?> option) =>
        FluxConventions.TryParse(parse.GetValue(option), out var c) ? c : null;

    /// <summary><c>--model</c>.</summary>
    public Option<string> Model { get; }

    /// <summary><c>--flux-convention</c>.</summary>
    public Option<string?> FluxConvention { get; }

    /// <summary>Parses a finite number with a one-line message naming the option.</summary>
    internal static double? NumberParser(System.CommandLine.Parsing.ArgumentResult result)
    {
        string text = result.Tokens.Count > 0 ? result.Tokens[0].Value : "";
        if (double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out double v) && double.IsFinite(v)) return v;
        string name = result.Parent is System.CommandLine.Parsing.OptionResult o ? o.Option.Name : "option";
        result.AddError($"{name} expects a number (dot as decimal separator); got '{text}'.");
        return null;
    }

    /// <summary>Option name for a parameter name.</summary>
    public static string OptionName(string parameter) => "--" + parameter.Replace('_', '-');

    /// <summary>Adds every option to <paramref name="command"/>.</summary>
    public void AddTo(Command command)
    {
        command.Options.Add(Model);
        foreach (var (_, option) in _parameters) command.Options.Add(option);
        command.Options.Add(FluxConvention);
    }

    /// <summary>
    /// Builds the chosen model; options that do not apply, or refused values, throw <see cref="ArgumentException"/>. A
    /// <c>--flux-convention</c> sets a static model's luminosity exponent; for another model it is refused unless
    /// <paramref name="conventionForOtherModels"/> (power: it then applies to the static candidates only).
    /// </summary>
    public IWorldModel Create(ParseResult parse, bool conventionForOtherModels = false)
    {
        var family = WorldModels.Get(parse.GetValue(Model) ?? "lcdm");
        var values = new Dictionary<string, double>();
        foreach (var (spec, option) in _parameters)
        {
            if (parse.GetValue(option) is not { } value) continue;
            if (!family.Parameters.Any(p => p.Name == spec.Name))
                throw new ArgumentException($"Option {option.Name} does not apply to world model '{family.Name}'; its options are {Describe(family)}.");
            values[spec.Name] = value;
        }
        if (Convention(parse, FluxConvention) is { } convention)
        {
            string q = WorldModelParameters.LuminosityExponent.Name;
            if (!FluxConventions.Applies(family))
            {
                if (!conventionForOtherModels)
                    throw new ArgumentException($"Option --flux-convention applies only to static world models ({string.Join(", ", FluxConventions.StaticFamilyNames)}), not to '{family.Name}'.");
            }
            else if (values.ContainsKey(q))
                throw new ArgumentException("Give either --flux-convention or --luminosity-exponent, not both.");
            else
                values[q] = convention.LuminosityExponent();
        }
        return family.Create(values);
    }

    private static string Describe(IWorldModelFamily family) => string.Join(", ", family.Parameters.Select(p => OptionName(p.Name)));
}

using SizeTest.Foundation.Text;
using SizeTest.Cosmology;
using SizeTest.Inference;

namespace SizeTest.Inference.Comparison;

/// <summary>Whether the stated test says a model needs an evolution term.</summary>
public enum EvolutionNeed
{
    /// <summary>The likelihood-ratio test rejects zero evolution at the stated level.</summary>
    Needed,
    /// <summary>The test does not reject zero at the stated level.</summary>
    NotNeeded,
    /// <summary>No test was run (e.g. zero lies outside the parameter's bounds): no claim about zero is made.</summary>
    NotTested,
}

/// <summary>
/// One row of the table every "needs evolution" statement comes from: a model, an evolution parameter, its
/// estimate with the 68% interval, the one test that decides whether zero is excluded (the likelihood-ratio test
/// of the model against the same model with the parameter fixed at 0, Wilks 1938, at the 95% level), and the
/// comparison with published expectations.
/// </summary>
/// <param name="Model">Model machine name.</param>
/// <param name="Parameter"><c>size_evolution</c> or <c>sb_evolution</c>.</param>
/// <param name="Value">Estimate.</param>
/// <param name="Lo">Lower end of the 68% interval.</param>
/// <param name="Hi">Upper end of the 68% interval.</param>
/// <param name="PValue">LRT p-value for zero, when the test was run.</param>
/// <param name="Need">What the test says.</param>
/// <param name="Plausibility">Comparison with <paramref name="Expectation"/>.</param>
/// <param name="Expectation">The expectation in force, if any.</param>
public sealed record EvolutionTestRow(string Model, string Parameter, double Value, double Lo, double Hi, double? PValue,
    EvolutionNeed Need, Plausibility Plausibility, EvolutionExpectation? Expectation)
{
    /// <summary>Display name of the model.</summary>
    public string ModelLabel => WorldModelDisplayNames.For(Model);
    /// <summary>"size evolution" or "surface-brightness evolution".</summary>
    public string What => EvolutionTestTable.What(Parameter);
    /// <summary>"a" or "b".</summary>
    public string Symbol => EvolutionTestTable.Symbol(Parameter);
    /// <summary><c>lower</c> or <c>upper</c> when the estimate sits on that bound of the parameter's range (its interval is
    /// then one-sided, from the bound to the profile's ½ crossing), else null.</summary>
    public string? AtBound { get; init; }

    /// <summary>The estimate with its 68% interval at the PDG precision; at a bound, the value and the one-sided interval
    /// (never a ± interval).</summary>
    public string ValueText => AtBound is { } b
        ? $"{PdgRounding.Plain(Value)} at its {b} bound (one-sided 68% interval {PdgRounding.IntervalBounds(Value, Lo, Hi)})"
        : PdgRounding.ValueWithInterval(Value, Lo, Hi);
    /// <summary>Half-width of the 68% interval (mean of the two sides).</summary>
    public double Error => 0.5 * (Hi - Lo);
}

/// <summary>
/// Builds the one table of evolution tests a report's conclusions are generated from, and words each row the same
/// way everywhere (report, CLI, results.json). Only the likelihood-ratio test says whether zero is excluded; the
/// 68% interval is quoted as an estimate and never used to claim an exclusion, so two statements cannot disagree.
/// </summary>
public static class EvolutionTestTable
{
    /// <summary>The test's level: zero evolution is rejected when p &lt; 0.05 (95% level).</summary>
    public const double Alpha = 0.05;

    /// <summary>The level in words.</summary>
    public const string LevelWords = "95% level";

    /// <summary>The evolution parameters the table covers.</summary>
    public static IReadOnlyList<string> Parameters { get; } = [NuisanceParameters.Names.SizeEvolution, NuisanceParameters.Names.SbEvolution];

    /// <summary>The parameter in words ("size evolution", "size evolution of group early").</summary>
    public static string What(string parameter)
    {
        ArgumentNullException.ThrowIfNull(parameter);
        string words = BaseName(parameter) switch
        {
            NuisanceParameters.Names.SizeEvolution => "size evolution",
            NuisanceParameters.Names.SbEvolution => "surface-brightness evolution",
            _ => BaseName(parameter),
        };
        return GroupOf(parameter) is { } g ? $"{words} of group {g}" : words;
    }

    /// <summary>The symbol: "a", "b", or for a population "a[early]".</summary>
    public static string Symbol(string parameter)
    {
        ArgumentNullException.ThrowIfNull(parameter);
        string b = BaseName(parameter) switch { NuisanceParameters.Names.SizeEvolution => "a", NuisanceParameters.Names.SbEvolution => "b", var other => other };
        return GroupOf(parameter) is { } g ? $"{b}[{g}]" : b;
    }

    /// <summary>A parameter's name without its population suffix (<c>size_evolution@early</c> → <c>size_evolution</c>).</summary>
    public static string BaseName(string parameter)
    {
        ArgumentNullException.ThrowIfNull(parameter);
        int k = parameter.IndexOf('@', StringComparison.Ordinal);
        return k < 0 ? parameter : parameter[..k];
    }

    /// <summary>The population of a <c>NAME@GROUP</c> parameter, or null.</summary>
    public static string? GroupOf(string parameter)
    {
        ArgumentNullException.ThrowIfNull(parameter);
        int k = parameter.IndexOf('@', StringComparison.Ordinal);
        return k < 0 ? null : parameter[(k + 1)..];
    }

    /// <summary>The evolution parameters of a model's parameter list (each population's own, <c>NAME@GROUP</c>, included), in table order.</summary>
    public static IEnumerable<string> EvolutionNames(IEnumerable<string> parameterNames) =>
        parameterNames.Where(n => Parameters.Contains(BaseName(n))).OrderBy(n => Parameters.ToList().IndexOf(BaseName(n)));

    /// <summary>Whether the settings make b the SB change at fixed luminosity (<see cref="EvolutionExpectation.InForce"/>).</summary>
    public static bool SbAtFixedLuminosity(FitSettings settings)
    {
        ArgumentNullException.ThrowIfNull(settings);
        return settings.Observable == ObservableKind.Joint && settings.Survey is { SizeRelation: not "none" };
    }

    /// <summary>Rows for every free evolution parameter of every model, in the models' ranked order.</summary>
    public static IReadOnlyList<EvolutionTestRow> From(FitResult result)
    {
        ArgumentNullException.ThrowIfNull(result);
        var expectations = EvolutionExpectation.InForce(result.Settings.Expected, SbAtFixedLuminosity(result.Settings), result.Settings.CompactRadioSources);
        var rows = new List<EvolutionTestRow>();
        foreach (var m in result.Models)
            foreach (var name in EvolutionNames(m.Parameters.Select(p => p.Name)))
            {
                var est = m.Parameters.FirstOrDefault(p => p.Name == name);
                if (est is null || est.Fixed) continue;
                var lrt = result.LikelihoodRatioTests.FirstOrDefault(t => t.Model == m.Name && t.Parameter == name && t.NullValue == 0);
                var need = lrt is null ? EvolutionNeed.NotTested : lrt.PValue < Alpha ? EvolutionNeed.Needed : EvolutionNeed.NotNeeded;
                var exp = expectations.FirstOrDefault(e => e.Parameter == BaseName(name));
                rows.Add(new EvolutionTestRow(m.Name, name, est.Value, est.Lo, est.Hi, lrt?.PValue, need,
                    exp?.Judge(est.Value, est.Lo, est.Hi) ?? Plausibility.NotJudged, exp) { AtBound = est.AtBound });
            }
        return rows;
    }

    /// <summary>
    /// The one statement of a row: "ΛCDM needs size evolution: a = −1.018 ± 0.034 (68% interval); the likelihood-ratio
    /// test against a = 0 rejects zero at the 95% level (p = …)."
    /// </summary>
    public static string Statement(EvolutionTestRow row)
    {
        ArgumentNullException.ThrowIfNull(row);
        string est = row.AtBound is null ? $"{row.Symbol} = {row.ValueText} (68% interval)" : $"{row.Symbol} = {row.ValueText}";
        string p = row.PValue is { } pv ? LikelihoodRatioTest.FormatPValue(pv) : "";
        return row.Need switch
        {
            EvolutionNeed.Needed => $"{row.ModelLabel} needs {row.What}: {est}; the likelihood-ratio test against {row.Symbol} = 0 rejects zero at the {LevelWords} ({p}).",
            EvolutionNeed.NotNeeded => $"{row.ModelLabel} does not need {row.What}: {est}; the likelihood-ratio test against {row.Symbol} = 0 does not reject zero at the {LevelWords} ({p}).",
            _ => $"{row.ModelLabel}, {row.What}: {est}; no likelihood-ratio test was run, so no claim is made about zero.",
        };
    }

    /// <summary>The plausibility in a few words, for table cells ("plausible", "wrong sign", …).</summary>
    public static string PlausibilityWords(Plausibility p) => p switch
    {
        Plausibility.Plausible => "plausible",
        Plausibility.Outside => "outside expected range",
        Plausibility.FarOutside => "far outside expected range",
        Plausibility.WrongSign => "wrong sign",
        _ => "not judged",
    };

    /// <summary>
    /// The part of a call-out for one row ("b = −1.96 ± 0.02 has the wrong sign (galaxies fading into the past;
    /// passive evolution gives b &gt; 0)"), or null when the row is plausible or not judged.
    /// </summary>
    public static string? CallOutFragment(EvolutionTestRow row)
    {
        ArgumentNullException.ThrowIfNull(row);
        if (row.Expectation is not { } e) return null;
        string range = $"[{PdgRounding.Plain(e.Lo)}, {PdgRounding.Plain(e.Hi)}]";
        string physical = BaseName(row.Parameter) switch
        {
            NuisanceParameters.Names.SizeEvolution => row.Value > 0 ? "objects larger in the past; sizes grow with time, so a < 0" : "objects smaller in the past",
            NuisanceParameters.Names.SbEvolution => row.Value < 0 ? "galaxies fading into the past; ageing stellar populations give b > 0" : "galaxies brightening into the past",
            _ => e.ExpectedSign > 0 ? "expected > 0" : "expected < 0",
        };
        string v = $"{row.Symbol} = {row.ValueText}";
        return row.Plausibility switch
        {
            Plausibility.WrongSign => $"{v} has the wrong sign ({physical})",
            Plausibility.FarOutside => $"{v} lies far outside the expected {range}",
            Plausibility.Outside => $"{v} lies outside the expected {range}",
            _ => null,
        };
    }

    /// <summary>A call-out naming the model for one row ("static linear: a = … has the wrong sign (…)."), or null.</summary>
    public static string? CallOut(EvolutionTestRow row) =>
        CallOutFragment(row) is { } f ? $"{row.ModelLabel}: {f}." : null;
}

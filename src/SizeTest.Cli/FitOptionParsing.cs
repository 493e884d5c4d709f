using System.Globalization;
using SizeTest.Foundation.Errors;
using SizeTest.Inference;

namespace SizeTest.Cli;

/// <summary>Parses the <c>fit</c> verb's NAME=VALUE style options into inference types. No physics.</summary>
internal static class FitOptionParsing
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <summary>Splits repeated and comma-separated values (<c>--free omega_m,h0 --free w0</c>).</summary>
    public static IEnumerable<string> List(IEnumerable<string>? values) =>
        (values ?? []).SelectMany(v => v.Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries));

    /// <summary>Parses a finite number or throws naming the option.</summary>
    public static double Number(string text, string option, string what)
    {
        if (double.TryParse(text.Trim(), NumberStyles.Float, Inv, out var v) && double.IsFinite(v)) return v;
        throw new InputException($"{option}: '{text}' is not a number ({what}); write e.g. {option} {Example(option)}");
    }

    private static string Example(string option) => option switch
    {
        "--fix" => "size_evolution=0",
        "--prior" => "omega_m=0.3,0.02",
        "--expect" => "size_evolution=-1.5:-0.7",
        "--bound" => "omega_m=0.05:1",
        _ => "VALUE",
    };

    private static (string Name, string Value) NameValue(string text, string option)
    {
        int eq = text.IndexOf('=');
        if (eq <= 0 || eq == text.Length - 1)
            throw new InputException($"{option}: '{text}' is not NAME=VALUE; write e.g. {option} {Example(option)}");
        return (text[..eq].Trim(), text[(eq + 1)..].Trim());
    }

    /// <summary><c>--fix NAME=VALUE</c>.</summary>
    public static Dictionary<string, double> Fixed(IEnumerable<string>? values)
    {
        var d = new Dictionary<string, double>(StringComparer.Ordinal);
        foreach (var t in values ?? [])
        {
            var (n, v) = NameValue(t, "--fix");
            double x = Number(v, "--fix", "the fixed value");
            if (d.TryGetValue(n, out var before) && before != x)
                throw new InputException($"--fix {n} is given twice, at {before.ToString("R", CultureInfo.InvariantCulture)} and {x.ToString("R", CultureInfo.InvariantCulture)}; give it once");
            d[n] = x;
        }
        return d;
    }

    /// <summary>
    /// Refuses parameter options that contradict each other (exit 2), since no reading of them is what the user meant: a parameter
    /// both <c>--free</c> and <c>--fix</c>ed, given a <c>--prior</c> while <c>--fix</c>ed, or <c>--bound</c>ed while <c>--fix</c>ed.
    /// </summary>
    public static void CheckContradictions(IReadOnlySet<string> free, IReadOnlyDictionary<string, double> fixedValues,
        IReadOnlyDictionary<string, (double Mean, double Sd)>? priors = null, IReadOnlyDictionary<string, (double Lo, double Hi)>? bounds = null)
    {
        foreach (var (name, value) in fixedValues.OrderBy(kv => kv.Key, StringComparer.Ordinal))
        {
            string at = value.ToString("R", CultureInfo.InvariantCulture);
            if (free.Contains(name))
                throw new InputException($"{name} is both --free and --fix {name}={at}; a parameter is either fitted or held: drop one of the two");
            if (priors?.ContainsKey(name) == true)
                throw new InputException($"{name} has a --prior and is held by --fix {name}={at}; a prior needs a fitted parameter: drop --fix to fit it under the prior, or drop --prior");
            if (bounds?.ContainsKey(name) == true)
                throw new InputException($"{name} has a --bound and is held by --fix {name}={at}; bounds apply to fitted parameters: drop one of the two");
        }
    }

    /// <summary><c>--prior NAME=MEAN,SD</c>.</summary>
    public static Dictionary<string, (double Mean, double Sd)> Priors(IEnumerable<string>? values)
    {
        var d = new Dictionary<string, (double, double)>(StringComparer.Ordinal);
        foreach (var t in values ?? [])
        {
            var (n, v) = NameValue(t, "--prior");
            var parts = v.Split(',');
            if (parts.Length != 2) throw new InputException($"--prior: '{t}' needs NAME=MEAN,SD; write e.g. --prior omega_m=0.3,0.02");
            double mean = Number(parts[0], "--prior", "the prior mean"), sd = Number(parts[1], "--prior", "the prior standard deviation");
            if (!(sd > 0)) throw new InputException($"--prior: the standard deviation in '{t}' must be positive");
            d[n] = (mean, sd);
        }
        return d;
    }

    /// <summary><c>NAME=LO:HI</c> for <c>--expect</c> and <c>--bound</c>.</summary>
    public static Dictionary<string, (double Lo, double Hi)> Ranges(IEnumerable<string>? values, string option)
    {
        var d = new Dictionary<string, (double, double)>(StringComparer.Ordinal);
        foreach (var t in values ?? [])
        {
            var (n, v) = NameValue(t, option);
            // Split at the first ':' that is not a leading minus sign's neighbour: "-1.5:-0.7".
            int colon = v.IndexOf(':', 1);
            if (colon <= 0) throw new InputException($"{option}: '{t}' needs NAME=LO:HI; write e.g. {option} {Example(option)}");
            double lo = Number(v[..colon], option, "the lower end"), hi = Number(v[(colon + 1)..], option, "the upper end");
            if (!(lo < hi)) throw new InputException($"{option}: in '{t}' the lower end must be below the upper end");
            d[n] = (lo, hi);
        }
        return d;
    }

    /// <summary><c>--steps</c>: <c>auto</c> (0: run to convergence) or a whole number of steps per walker.</summary>
    public static int Steps(string? text)
    {
        if (text is null || text.Equals("auto", StringComparison.OrdinalIgnoreCase)) return 0;
        if (int.TryParse(text, System.Globalization.NumberStyles.None, System.Globalization.CultureInfo.InvariantCulture, out int n) && n > 0) return n;
        throw new InputException($"--steps must be auto or a whole number of steps per walker; got '{text}'");
    }

    /// <summary>The observable kind from <c>--observable</c>.</summary>
    public static ObservableKind Observable(string text) =>
        ObservableKinds.TryParse(text, out var kind) ? kind
            : throw new InputException($"--observable must be {string.Join(", ", ObservableKinds.Names.SkipLast(1))} or {ObservableKinds.Names[^1]}; got '{text}'");
}

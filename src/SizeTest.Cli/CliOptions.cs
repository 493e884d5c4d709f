using System.CommandLine;

namespace SizeTest.Cli;

/// <summary>Options shared by several verbs.</summary>
internal static class CliOptions
{
    /// <summary><c>--verbose</c>: show stack traces on errors.</summary>
    public static readonly Option<bool> Verbose = new("--verbose")
    {
        Description = "Show details (stack traces) on errors.",
        Recursive = true,
    };

    /// <summary>Creates a <c>--format table|csv|json</c> option (a new instance per command).</summary>
    public static Option<string> Format() => new Option<string>("--format")
    {
        Description = "Output format: table (default, for people), csv or json.",
        DefaultValueFactory = _ => "table",
    }.AcceptOnlyFromAmong("table", "csv", "json");

    /// <summary>A text option with its help text (its value is null when not given).</summary>
    public static Option<string?> Text(string name, string description) => new(name) { Description = description };

    /// <summary>A number option with its help text, parsed in the invariant culture (<see cref="WorldModelOptions.NumberParser"/>).</summary>
    public static Option<double?> Number(string name, string description) =>
        new(name) { Description = description, CustomParser = WorldModelOptions.NumberParser };
}

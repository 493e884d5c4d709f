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
}

using SizeTest.Foundation.Errors;

namespace SizeTest.Cli;

/// <summary>
/// The CLI's spelling of a request setting: the library names settings (<see cref="SettingProblem"/>, e.g.
/// <c>live_points</c>), the CLI writes its flag (<c>--live-points</c>). A setting is its flag with
/// underscores for hyphens, except those listed here.
/// </summary>
internal static class SettingFlags
{
    private static readonly Dictionary<string, string> Exceptions = new(StringComparer.Ordinal)
    {
        ["sample_sizes"] = "--n",
    };

    /// <summary>The flag of <paramref name="setting"/>.</summary>
    public static string Flag(string setting) =>
        Exceptions.TryGetValue(setting, out var flag) ? flag : "--" + setting.Replace('_', '-');

    /// <summary>The message of <paramref name="e"/> with every setting written as its flag.</summary>
    public static string Message(InputException e) =>
        e.SettingProblems.Count == 0 ? e.Message : string.Join("; ", e.SettingProblems.Select(p => p.Render(Flag)));
}

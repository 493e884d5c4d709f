using SizeTest.Foundation.Errors;

namespace SizeTest.Cli;

/// <summary>
/// The CLI's spelling of a request setting: the library names settings (<see cref="SettingProblem"/>, e.g.
/// <c>live_points</c>), the CLI writes its flag (<c>--live-points</c>). A setting is its flag with
/// underscores for hyphens, except those listed here.
/// </summary>
internal static class SettingFlags
{
    /// <summary>The flag of <paramref name="setting"/>.</summary>
    public static string Flag(string setting) => setting switch
    {
        "sample_sizes" or "object_count" => "--n",   // power's list of sample sizes, simulate's number of objects
        _ => "--" + setting.Replace('_', '-'),
    };

    /// <summary>A note or warning from an inner stage with every setting written as its flag (<see cref="SettingProblem.RenderText"/>).</summary>
    public static string Text(string text) => SettingProblem.RenderText(text, Flag);

    /// <summary>The message of <paramref name="e"/> with every setting written as its flag.</summary>
    public static string Message(Exception e) => e switch
    {
        InputException ie => ie.Render(Flag),
        AnalysisException ae => ae.Render(Flag),
        _ => e.Message,
    };
}

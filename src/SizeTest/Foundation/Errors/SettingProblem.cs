using System.Text.RegularExpressions;

namespace SizeTest.Foundation.Errors;

/// <summary>
/// A bad setting of a request (e.g. too few MCMC walkers), worded with the <em>setting</em> names, never a
/// command-line flag: the template writes each setting as <c>{name}</c> (snake_case, e.g. <c>{live_points}</c>).
/// The library reads it with the setting names (<see cref="ToString"/>); a front end renders it with its own
/// spelling of each setting (the CLI maps <c>live_points</c> to <c>--live-points</c>).
/// </summary>
/// <param name="Template">One sentence with the settings as <c>{name}</c> placeholders.</param>
public sealed partial record SettingProblem(string Template)
{
    [GeneratedRegex(@"\{([a-z][a-z0-9_]*)\}")]
    private static partial Regex Placeholder();

    /// <summary>The settings the problem names, in order of first mention.</summary>
    public IReadOnlyList<string> Settings => Placeholder().Matches(Template).Select(m => m.Groups[1].Value).Distinct(StringComparer.Ordinal).ToArray();

    /// <summary>The sentence with each setting written by <paramref name="spell"/>.</summary>
    public string Render(Func<string, string> spell) => Placeholder().Replace(Template, m => spell(m.Groups[1].Value));

    /// <summary>The sentence with the setting names themselves.</summary>
    public override string ToString() => Render(s => s);

    /// <summary>An <see cref="InputException"/> carrying <paramref name="problems"/> (its message names the settings).</summary>
    public static InputException Exception(IReadOnlyList<SettingProblem> problems) =>
        new(string.Join("; ", problems.Select(p => p.ToString()))) { SettingProblems = problems };

    /// <summary>Throws <see cref="Exception(IReadOnlyList{SettingProblem})"/> when <paramref name="problems"/> is not empty.</summary>
    public static void ThrowIfAny(IReadOnlyList<SettingProblem> problems)
    {
        if (problems.Count > 0) throw Exception(problems);
    }
}

using System.Text.RegularExpressions;

namespace SizeTest.Foundation.Errors;

/// <summary>
/// A bad setting of a request (e.g. too few MCMC walkers), worded with the <em>setting</em> names, never a
/// command-line flag: the template writes each setting as <c>{name}</c> (snake_case, e.g. <c>{live_points}</c>).
/// The library reads it with the setting names (<see cref="ToString"/>); a front end renders it with its own
/// spelling of each setting (the CLI maps <c>live_points</c> to <c>--live-points</c>).
/// </summary>
/// <remarks>
/// A literal <c>{</c> is written <c>{{</c> (<see cref="Literal"/>): a user's value inserted into a template (a column name,
/// a path, a group label) is escaped so that one reading <c>{out}</c> stays text. A template written as an interpolated
/// string (<c>SettingProblem.Input($"…")</c>, <c>new SettingProblem($"…")</c>, <see cref="Text"/>) escapes every inserted
/// value itself (<see cref="SettingTemplateHandler"/>); only a <see cref="SettingText"/> is inserted as it is.
/// </remarks>
/// <param name="Template">One sentence with the settings as <c>{name}</c> placeholders.</param>
public sealed partial record SettingProblem(string Template)
{
    /// <summary>A problem from an interpolated template whose inserted values are escaped (<see cref="SettingTemplateHandler"/>).</summary>
    public SettingProblem(ref SettingTemplateHandler template) : this(template.ToStringAndClear()) { }

    // An escaped brace ({{) or a placeholder ({name}, group 1).
    [GeneratedRegex(@"\{\{|\{([a-z][a-z0-9_]*)\}")]
    private static partial Regex Placeholder();

    /// <summary>The settings the problem names, in order of first mention.</summary>
    public IReadOnlyList<string> Settings => Placeholder().Matches(Template).Where(m => m.Groups[1].Success).Select(m => m.Groups[1].Value).Distinct(StringComparer.Ordinal).ToArray();

    /// <summary><paramref name="value"/> escaped for a template (each <c>{</c> doubled), so that rendering shows it as it is.</summary>
    public static string Literal(string value) => value.Replace("{", "{{", StringComparison.Ordinal);

    /// <summary>A note or warning naming settings, from an interpolated template whose inserted values are escaped
    /// (<see cref="SettingTemplateHandler"/>); render it with <see cref="RenderText"/>.</summary>
    public static string Text(ref SettingTemplateHandler template) => template.ToStringAndClear();

    /// <summary>The sentence with each setting written by <paramref name="spell"/>.</summary>
    public string Render(Func<string, string> spell) => RenderText(Template, spell);

    /// <summary>
    /// Any text an inner stage hands on for a user to read (a note, a warning, the reason a column was chosen) that names
    /// settings as <c>{name}</c>, with each setting written by <paramref name="spell"/>: the same placeholders as a problem's
    /// template, rendered by the front end that shows or writes the text (the CLI with its flags, a study with its keys).
    /// </summary>
    public static string RenderText(string text, Func<string, string> spell) =>
        Placeholder().Replace(text, m => m.Groups[1].Success ? spell(m.Groups[1].Value) : "{");

    /// <summary>
    /// The problem with the settings <paramref name="spell"/> has a spelling for written in it as text, and the others
    /// still <c>{name}</c> placeholders: a front end spells the settings it owns (a study its keys) and leaves the rest
    /// to the one that shows the message (the CLI's flags, e.g. <c>run</c>'s own <c>{out}</c>).
    /// </summary>
    /// <param name="spell">The spelling of a setting, or null to leave its placeholder.</param>
    public SettingProblem Respell(Func<string, string?> spell) =>
        new(Placeholder().Replace(Template, m => m.Groups[1].Success && spell(m.Groups[1].Value) is { } s ? Literal(s) : m.Value));

    /// <summary>The sentence with the setting names themselves.</summary>
    public override string ToString() => Render(s => s);

    /// <summary>An <see cref="InputException"/> carrying <paramref name="problems"/> (its message names the settings).</summary>
    public static InputException Exception(IReadOnlyList<SettingProblem> problems) =>
        new(string.Join("; ", problems.Select(p => p.ToString()))) { SettingProblems = problems };

    /// <summary>An <see cref="InputException"/> (exit 2) for the one problem <paramref name="template"/>, with the location
    /// of the bad input where one applies (as <see cref="InputException(string, string?, long?, string?, System.Exception?, string)"/>).</summary>
    public static InputException Input(string template, string? file = null, long? line = null, string? column = null, Exception? inner = null, string lineLabel = "line") =>
        new(new SettingProblem(template).ToString(), file, line, column, inner, lineLabel) { SettingProblems = [new SettingProblem(template)] };

    /// <summary><see cref="Input(string, string?, long?, string?, System.Exception?, string)"/> for an interpolated template
    /// whose inserted values are escaped (<see cref="SettingTemplateHandler"/>).</summary>
    public static InputException Input(ref SettingTemplateHandler template, string? file = null, long? line = null, string? column = null, Exception? inner = null, string lineLabel = "line") =>
        Input(template.ToStringAndClear(), file, line, column, inner, lineLabel);

    /// <summary>An <see cref="AnalysisException"/> (exit 1) whose advice names settings.</summary>
    public static AnalysisException Analysis(string template, Exception? inner = null) =>
        new(new SettingProblem(template).ToString(), inner) { SettingProblems = [new SettingProblem(template)] };

    /// <summary><see cref="Analysis(string, System.Exception?)"/> for an interpolated template whose inserted values are escaped.</summary>
    public static AnalysisException Analysis(ref SettingTemplateHandler template, Exception? inner = null) =>
        Analysis(template.ToStringAndClear(), inner);

    /// <summary>The placeholder of <paramref name="setting"/> in a template: <c>{setting}</c> (for a setting held in a variable).</summary>
    public static SettingText Name(string setting) => new("{" + setting + "}");

    /// <summary>Throws <see cref="Exception(IReadOnlyList{SettingProblem})"/> when <paramref name="problems"/> is not empty.</summary>
    public static void ThrowIfAny(IReadOnlyList<SettingProblem> problems)
    {
        if (problems.Count > 0) throw Exception(problems);
    }
}

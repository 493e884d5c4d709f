using System.Runtime.CompilerServices;

namespace SizeTest.Foundation.Errors;

/// <summary>
/// Builds a template that names settings (<see cref="SettingProblem"/>) from an interpolated string: the literal parts are
/// the library's own words and placeholders (<c>$"choose another {{out}}"</c> gives <c>{out}</c>); every inserted value
/// (a path, a column name, a group label, a number) is escaped with <see cref="SettingProblem.Literal"/>, so a value that
/// happens to read <c>{out}</c> is shown as it is and never rendered as a setting. A <see cref="SettingText"/> value is
/// inserted unescaped (its placeholders are meant). Values are formatted as <see cref="DefaultInterpolatedStringHandler"/>
/// formats them (current culture, alignment and format strings).
/// </summary>
[InterpolatedStringHandler]
public ref struct SettingTemplateHandler
{
    private DefaultInterpolatedStringHandler _text;

    /// <summary>Starts a template (called by the compiler).</summary>
    public SettingTemplateHandler(int literalLength, int formattedCount) => _text = new DefaultInterpolatedStringHandler(literalLength, formattedCount);

    /// <summary>Appends a literal part of the template as written.</summary>
    public void AppendLiteral(string value) => _text.AppendLiteral(value);

    /// <summary>Appends a text whose placeholders are meant, unescaped.</summary>
    public void AppendFormatted(SettingText value) => _text.AppendLiteral(value.Template);

    /// <summary>Appends a value, escaped.</summary>
    public void AppendFormatted<T>(T value) => AppendFormatted(value, 0, null);

    /// <summary>Appends a value in <paramref name="format"/>, escaped.</summary>
    public void AppendFormatted<T>(T value, string? format) => AppendFormatted(value, 0, format);

    /// <summary>Appends a value padded to <paramref name="alignment"/>, escaped.</summary>
    public void AppendFormatted<T>(T value, int alignment) => AppendFormatted(value, alignment, null);

    /// <summary>Appends a value in <paramref name="format"/> padded to <paramref name="alignment"/>, escaped.</summary>
    public void AppendFormatted<T>(T value, int alignment, string? format)
    {
        var one = new DefaultInterpolatedStringHandler(0, 1);
        one.AppendFormatted(value, alignment, format);
        _text.AppendLiteral(SettingProblem.Literal(one.ToStringAndClear()));
    }

    /// <summary>The template.</summary>
    public string ToStringAndClear() => _text.ToStringAndClear();
}

namespace SizeTest.Foundation.Errors;

/// <summary>
/// A piece of text that already names settings as <c>{name}</c> placeholders (<see cref="SettingProblem"/>), e.g. a
/// placeholder made by <see cref="SettingProblem.Name"/> or a description such as <c>the MCMC chains ({walkers} × {steps})</c>.
/// Inserted into a template built by <see cref="SettingTemplateHandler"/> it is kept as it is, where any other inserted value
/// is escaped (<see cref="SettingProblem.Literal"/>) so that a user's column name, path or label reading <c>{out}</c> stays
/// literal text.
/// </summary>
/// <param name="Template">The text with its placeholders.</param>
public readonly record struct SettingText(string Template)
{
    /// <summary>The text with its placeholders unrendered.</summary>
    public override string ToString() => Template;

    /// <summary>The text itself (placeholders unrendered).</summary>
    public static implicit operator string(SettingText text) => text.Template;
}

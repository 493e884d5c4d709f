namespace SizeTest.Foundation.Errors;

/// <summary>
/// The analysis ran but failed: a fit did not converge, a required check failed.
/// The command line maps it to exit code 1.
/// </summary>
public sealed class AnalysisException : Exception
{
    /// <summary>Creates the error with a one-sentence message.</summary>
    public AnalysisException(string message, Exception? inner = null) : base(message, inner) { }

    /// <summary>When the advice names request settings: the problems, worded with setting names (<see cref="SettingProblem"/>);
    /// empty otherwise.</summary>
    public IReadOnlyList<SettingProblem> SettingProblems { get; init; } = [];

    /// <summary>The message with each setting written by <paramref name="spell"/>; <see cref="Exception.Message"/> when the
    /// error names no setting.</summary>
    public string Render(Func<string, string> spell) =>
        SettingProblems.Count == 0 ? Message : string.Join("; ", SettingProblems.Select(p => p.Render(spell)));
}

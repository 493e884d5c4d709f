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

    /// <summary>This error with the settings <paramref name="spell"/> spells written in (<see cref="SettingProblem.Respell"/>),
    /// the others left to the front end that shows it, and this error as the inner one. Itself when it names no setting.</summary>
    /// <param name="spell">The spelling of a setting, or null to leave it to the caller.</param>
    public AnalysisException Respelled(Func<string, string?> spell)
    {
        if (SettingProblems.Count == 0) return this;
        var problems = SettingProblems.Select(p => p.Respell(spell)).ToArray();
        return new AnalysisException(string.Join("; ", problems.Select(p => p.ToString())), this) { SettingProblems = problems };
    }
}

namespace SizeTest.Foundation.Errors;

/// <summary>
/// Bad input from the user: an unreadable file, a malformed value, an unknown option value.
/// The command line maps it to exit code 2. The message is one sentence that names the
/// file, the line or row, and the column where one applies, and says what to do.
/// </summary>
public sealed class InputException : Exception
{
    /// <summary>Creates the error.</summary>
    /// <param name="message">One clear sentence (without the location prefix).</param>
    /// <param name="file">File that was being read, if any.</param>
    /// <param name="line">1-based line (text formats) or row (tables), if known.</param>
    /// <param name="column">Column name or 1-based index, if known.</param>
    /// <param name="inner">Underlying exception, kept for <c>--verbose</c>.</param>
    /// <param name="lineLabel">The word before <paramref name="line"/>: <c>line</c> (default, text formats) or <c>row</c> (binary tables such as Parquet, which have no lines).</param>
    public InputException(string message, string? file = null, long? line = null, string? column = null, Exception? inner = null, string lineLabel = "line")
        : base(Compose(message, file, line, column, lineLabel), inner)
    {
        File = file;
        Line = line;
        Column = column;
        Reason = message;
        _lineLabel = lineLabel;
    }

    private readonly string _lineLabel;

    /// <summary>File being read, if any.</summary>
    public string? File { get; }

    /// <summary>1-based line or row number, if known.</summary>
    public long? Line { get; }

    /// <summary>Column name or index, if known.</summary>
    public string? Column { get; }

    /// <summary>The message without the location prefix.</summary>
    public string Reason { get; }

    /// <summary>When the error is about request settings: the problems, worded with setting names so that a front
    /// end can render them with its own spelling (<see cref="SettingProblem"/>); empty otherwise.</summary>
    public IReadOnlyList<SettingProblem> SettingProblems { get; init; } = [];

    /// <summary>The message with each setting of <see cref="SettingProblems"/> written by <paramref name="spell"/> (a front
    /// end's spelling, e.g. the CLI's flags), behind the same location prefix; <see cref="Exception.Message"/> when the
    /// error names no setting.</summary>
    public string Render(Func<string, string> spell) =>
        SettingProblems.Count == 0 ? Message : Compose(string.Join("; ", SettingProblems.Select(p => p.Render(spell))), File, Line, Column, _lineLabel);

    /// <summary>This error with the settings <paramref name="spell"/> spells written in (<see cref="SettingProblem.Respell"/>),
    /// the others left to the front end that shows it; the same location, and this error as the inner one (for
    /// <c>--verbose</c>). Itself when it names no setting.</summary>
    /// <param name="spell">The spelling of a setting, or null to leave it to the caller.</param>
    public InputException Respelled(Func<string, string?> spell)
    {
        if (SettingProblems.Count == 0) return this;
        var problems = SettingProblems.Select(p => p.Respell(spell)).ToArray();
        return new InputException(string.Join("; ", problems.Select(p => p.ToString())), File, Line, Column, this, _lineLabel) { SettingProblems = problems };
    }

    private static string Compose(string message, string? file, long? line, string? column, string lineLabel)
    {
        var where = new List<string>();
        if (file is not null) where.Add(file);
        if (line is not null) where.Add($"{lineLabel} {line}");
        // A position (a study file's character column, a headerless table's column number) reads "column 4"; a name is quoted.
        if (column is not null) where.Add(column.Length > 0 && column.All(char.IsAsciiDigit) ? $"column {column}" : $"column '{column}'");
        return where.Count == 0 ? message : $"{string.Join(", ", where)}: {message}";
    }
}

using System.CommandLine;
using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Text;

namespace SizeTest.Cli;

/// <summary>
/// What every verb needs from its surroundings: output and error writers (injected so tests
/// run in-process), whether the user asked for <c>--verbose</c>, whether the output is a
/// terminal (progress bars) or redirected (plain, quiet-but-logged progress lines).
/// </summary>
internal sealed class CliContext
{
    public CliContext(TextWriter stdout, TextWriter stderr, bool verbose)
    {
        Out = stdout;
        Err = stderr;
        Verbose = verbose;
        IsInteractive = ReferenceEquals(stderr, Console.Error) && !Console.IsErrorRedirected
                        && Environment.GetEnvironmentVariable("CI") is null;
    }

    /// <summary>Standard output (results, tables).</summary>
    public TextWriter Out { get; }

    /// <summary>Standard error (messages, progress).</summary>
    public TextWriter Err { get; }

    /// <summary>Whether stack traces are shown.</summary>
    public bool Verbose { get; }

    /// <summary>True when standard error is a terminal and not CI.</summary>
    public bool IsInteractive { get; }

    /// <summary>Sets <paramref name="action"/> as the action of <paramref name="command"/>: its exit code, or, when it throws,
    /// the exit code and one-line message of <see cref="Fail"/> (the scaffolding every verb shares).</summary>
    public void SetAction(Command command, Func<ParseResult, int> action) =>
        command.SetAction(parse =>
        {
            try
            {
                return action(parse);
            }
            catch (Exception ex)
            {
                return Fail(ex);
            }
        });

    /// <summary>Maps an exception to a one-line message and an exit code.</summary>
    public int Fail(Exception ex)
    {
        switch (ex)
        {
            case InputException ie:
                Err.WriteLine($"sizetest: {TerminalText.Escape(SettingFlags.Message(ie))}");
                if (Verbose && ie.InnerException is not null) Err.WriteLine(ie.InnerException);
                return ExitCodes.BadInput;
            case ArgumentException ae:
                Err.WriteLine($"sizetest: {TerminalText.Escape(ae.Message)}");
                if (Verbose) Err.WriteLine(ae);
                return ExitCodes.BadInput;
            case AnalysisException an:
                Err.WriteLine($"sizetest: {TerminalText.Escape(SettingFlags.Message(an))}");
                if (Verbose) Err.WriteLine(an);
                return ExitCodes.AnalysisFailed;
            case FileNotFoundException fnf:
                Err.WriteLine($"sizetest: file not found: {TerminalText.Escape(fnf.FileName ?? fnf.Message)}");
                return ExitCodes.BadInput;
            case DirectoryNotFoundException dnf:
                Err.WriteLine($"sizetest: folder not found: {TerminalText.Escape(dnf.Message)}");
                return ExitCodes.BadInput;
            default:
                Err.WriteLine($"sizetest: internal error: {TerminalText.Escape(ex.Message)} (run with --verbose for details and please report it)");
                if (Verbose) Err.WriteLine(ex);
                return ExitCodes.AnalysisFailed;
        }
    }
}

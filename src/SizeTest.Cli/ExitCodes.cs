namespace SizeTest.Cli;

/// <summary>The exit codes of the command-line contract.</summary>
public static class ExitCodes
{
    /// <summary>Success.</summary>
    public const int Success = 0;
    /// <summary>The analysis ran but failed (a fit did not converge, a check failed).</summary>
    public const int AnalysisFailed = 1;
    /// <summary>Bad usage or bad input.</summary>
    public const int BadInput = 2;
}

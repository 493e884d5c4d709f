namespace SizeTest.Foundation.Errors;

/// <summary>
/// The analysis ran but failed: a fit did not converge, a required check failed.
/// The command line maps it to exit code 1.
/// </summary>
public sealed class AnalysisException : Exception
{
    /// <summary>Creates the error with a one-sentence message.</summary>
    public AnalysisException(string message, Exception? inner = null) : base(message, inner) { }
}

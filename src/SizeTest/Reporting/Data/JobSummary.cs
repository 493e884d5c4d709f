namespace SizeTest.Reporting.Data;

/// <summary>What was run.</summary>
/// <param name="Title">Report title (e.g. the study's name).</param>
/// <param name="StudyFile">Study file path as given (relative to the working directory), or empty.</param>
/// <param name="Catalogue">Catalogue path or mock name.</param>
/// <param name="SizeTestVersion">SizeTest version string.</param>
/// <param name="GitCommit">Git commit of the SizeTest build, or empty when unknown.</param>
/// <param name="Seed">Seed of every random process in the run.</param>
/// <param name="Synthetic">True when the catalogue is synthetic (demo or mock); the report says so prominently.</param>
public sealed record JobSummary(string Title, string StudyFile, string Catalogue, string SizeTestVersion, string GitCommit, long Seed, bool Synthetic = false)
{
    /// <summary>Inference method in words (e.g. "maximum likelihood with 200 bootstrap resamples").</summary>
    public string Method { get; init; } = "";
}

using SizeTest.Inference;

namespace SizeTest.Studies;

/// <summary>How to run a study: where to write, whether to replace, and what to record.</summary>
public sealed record StudyRunOptions
{
    /// <summary>Output folder.</summary>
    public required string OutputDirectory { get; init; }
    /// <summary>Replace an existing non-empty output folder.</summary>
    public bool Force { get; init; }
    /// <summary>The user's memory limit in bytes (<c>run --max-memory</c>), or null: the machine's available memory is always a limit.</summary>
    public long? MaxMemoryBytes { get; init; }
    /// <summary>Working directory that manifest paths are relative to (default: the current directory).</summary>
    public string? WorkingDirectory { get; init; }
    /// <summary>SizeTest version for the manifest.</summary>
    public string Version { get; init; } = "unknown";
    /// <summary>Git commit of the build (read by the command line), or "unknown".</summary>
    public string GitCommit { get; init; } = "unknown";

    /// <summary>The command line that started the run, for the manifest (empty when not known).</summary>
    public string Command { get; init; } = "";
    /// <summary>Receives one line per stage (e.g. "loading catalogue …"); may be null.</summary>
    public Action<string>? Log { get; init; }
    /// <summary>Receives fit progress; may be null.</summary>
    public IProgress<FitProgress>? FitProgress { get; init; }
    /// <summary>Called after every output file is written into the staging folder and before it is swapped in (tests use it to fail midway).</summary>
    public Action<string>? BeforeCommit { get; init; }
}

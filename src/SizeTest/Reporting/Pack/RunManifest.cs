using System.Runtime.InteropServices;
using System.Security.Cryptography;
using System.Text;
using System.Text.Json;

namespace SizeTest.Reporting.Pack;

/// <summary>
/// The run manifest (<c>manifest.json</c>): what produced a report, so it can be reproduced —
/// SizeTest version and git commit, every input file with its SHA-256, the study file verbatim,
/// the seed, machine and runtime. Everything that changes from run to run of the same inputs
/// (timestamps and timings) sits in one separate field, <c>volatile</c>, written last; the rest
/// of the file is byte-identical for the same inputs, seed, build and machine.
/// </summary>
public sealed record RunManifest
{
    /// <summary>Manifest schema version.</summary>
    public const int SchemaVersion = 1;

    /// <summary>SizeTest version (e.g. 0.1.0).</summary>
    public required string SizeTestVersion { get; init; }

    /// <summary>Git commit of the build (from <c>git rev-parse HEAD</c>, read by the command line), or empty.</summary>
    public string GitCommit { get; init; } = "";

    /// <summary>Seed of every random process in the run.</summary>
    public required long Seed { get; init; }

    /// <summary>The command line that made the run (e.g. <c>sizetest run study.toml --out reports/x</c>), or empty.</summary>
    public string Command { get; init; } = "";

    /// <summary>Study file path relative to the working directory, or empty.</summary>
    public string StudyFilePath { get; init; } = "";

    /// <summary>Study file text verbatim, or empty.</summary>
    public string StudyFileText { get; init; } = "";

    /// <summary>Every file read, with its SHA-256, paths relative to the working directory, sorted by path.</summary>
    public IReadOnlyList<ManifestInput> Inputs { get; init; } = [];

    /// <summary>Machine description.</summary>
    public MachineInfo Machine { get; init; } = MachineInfo.Current();

    /// <summary>Timestamps and stage timings (the only part that differs between identical runs).</summary>
    public RunTimings Volatile { get; init; } = new(null, null, []);

    /// <summary>
    /// Describes <paramref name="paths"/> for the manifest: path relative to
    /// <paramref name="workingDirectory"/> (forward slashes) and SHA-256 of the content, sorted
    /// by path. Throws <see cref="FileNotFoundException"/> for a missing file.
    /// </summary>
    public static IReadOnlyList<ManifestInput> DescribeInputs(IEnumerable<string> paths, string workingDirectory)
    {
        var list = new List<ManifestInput>();
        foreach (var p in paths.Distinct())
        {
            var full = Path.GetFullPath(p, workingDirectory);
            using var fs = File.OpenRead(full);
            var hash = Convert.ToHexStringLower(SHA256.HashData(fs));
            list.Add(new ManifestInput(Path.GetRelativePath(workingDirectory, full).Replace('\\', '/'), hash));
        }
        return list.OrderBy(i => i.Path, StringComparer.Ordinal).ToList();
    }

    /// <summary>The manifest as indented JSON (UTF-8 text, LF line ends, fixed key order).</summary>
    public string ToJson()
    {
        using var ms = new MemoryStream();
        using (var w = new Utf8JsonWriter(ms, new JsonWriterOptions { Indented = true, Encoder = System.Text.Encodings.Web.JavaScriptEncoder.UnsafeRelaxedJsonEscaping }))
        {
            w.WriteStartObject();
            w.WriteNumber("schema_version", SchemaVersion);
            w.WriteString("sizetest_version", SizeTestVersion);
            w.WriteString("git_commit", GitCommit);
            w.WriteString("command", Command);
            w.WriteNumber("seed", Seed);
            w.WriteStartObject("study_file");
            w.WriteString("path", StudyFilePath);
            w.WriteString("text", StudyFileText);
            w.WriteEndObject();
            w.WriteStartArray("inputs");
            foreach (var i in Inputs)
            {
                w.WriteStartObject();
                w.WriteString("path", i.Path);
                w.WriteString("sha256", i.Sha256);
                w.WriteEndObject();
            }
            w.WriteEndArray();
            w.WriteStartObject("machine");
            w.WriteString("os", Machine.OperatingSystem);
            w.WriteString("architecture", Machine.Architecture);
            w.WriteNumber("processor_count", Machine.ProcessorCount);
            w.WriteString("host", Machine.HostName);
            w.WriteString("runtime", Machine.Runtime);
            w.WriteEndObject();
            w.WriteStartObject("volatile");
            w.WriteString("started_utc", Volatile.StartedUtc?.ToUniversalTime().ToString("yyyy-MM-ddTHH:mm:ss.fffZ", System.Globalization.CultureInfo.InvariantCulture) ?? "");
            w.WriteString("finished_utc", Volatile.FinishedUtc?.ToUniversalTime().ToString("yyyy-MM-ddTHH:mm:ss.fffZ", System.Globalization.CultureInfo.InvariantCulture) ?? "");
            w.WriteStartArray("timings");
            foreach (var t in Volatile.Stages)
            {
                w.WriteStartObject();
                w.WriteString("stage", t.Stage);
                w.WriteNumber("seconds", Math.Round(t.Seconds, 3));
                w.WriteEndObject();
            }
            w.WriteEndArray();
            w.WriteEndObject();
            w.WriteEndObject();
        }
        return Encoding.UTF8.GetString(ms.ToArray()).ReplaceLineEndings("\n") + "\n";
    }
}

/// <summary>One input file of a run.</summary>
/// <param name="Path">Path relative to the working directory, forward slashes.</param>
/// <param name="Sha256">SHA-256 of the file content, lower-case hex.</param>
public sealed record ManifestInput(string Path, string Sha256);

/// <summary>The machine and runtime a run used.</summary>
/// <param name="OperatingSystem">OS description.</param>
/// <param name="Architecture">Process architecture (e.g. X64).</param>
/// <param name="ProcessorCount">Logical processors.</param>
/// <param name="HostName">Host name.</param>
/// <param name="Runtime">.NET runtime description.</param>
public sealed record MachineInfo(string OperatingSystem, string Architecture, int ProcessorCount, string HostName, string Runtime)
{
    /// <summary>The machine this process runs on.</summary>
    public static MachineInfo Current() => new(
        RuntimeInformation.OSDescription, RuntimeInformation.ProcessArchitecture.ToString(),
        Environment.ProcessorCount, Environment.MachineName, RuntimeInformation.FrameworkDescription);
}

/// <summary>Timestamps and timings of a run (kept apart so the rest of the manifest is comparable).</summary>
/// <param name="StartedUtc">When the run started, or null.</param>
/// <param name="FinishedUtc">When it finished, or null.</param>
/// <param name="Stages">Wall-clock seconds per stage, in order.</param>
public sealed record RunTimings(DateTimeOffset? StartedUtc, DateTimeOffset? FinishedUtc, IReadOnlyList<StageTiming> Stages);

/// <summary>Wall-clock time of one stage.</summary>
/// <param name="Stage">Stage name (e.g. "load", "fit", "report").</param>
/// <param name="Seconds">Seconds.</param>
public sealed record StageTiming(string Stage, double Seconds);

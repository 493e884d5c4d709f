using System.Text.Json;
using System.Text.Json.Serialization;
using SizeTest.Foundation.Errors;

namespace SizeTest.Reporting.Data;

/// <summary>
/// Saves and loads <see cref="ReportData"/> as <c>report-data.json</c> (snake_case keys, NaN
/// and infinities written as strings) so <c>sizetest report DIR</c> can redraw a report
/// exactly without refitting. The file is written by the run next to <c>results.json</c>.
/// </summary>
public static class ReportDataJson
{
    /// <summary>File name inside a report folder.</summary>
    public const string FileName = "report-data.json";

    /// <summary>Format version written into the file; a file with another version is refused.</summary>
    public const int FormatVersion = 1;

    private static readonly JsonSerializerOptions Options = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.SnakeCaseLower,
        WriteIndented = true,
        NumberHandling = JsonNumberHandling.AllowNamedFloatingPointLiterals,
        Encoder = System.Text.Encodings.Web.JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
        RespectNullableAnnotations = true,
        UnmappedMemberHandling = JsonUnmappedMemberHandling.Disallow,
    };

    private sealed record Envelope(int FormatVersion, ReportData Report);

    /// <summary>Serialises the data (LF line ends, trailing newline; same data → same bytes).</summary>
    public static string ToJson(ReportData data) =>
        JsonSerializer.Serialize(new Envelope(FormatVersion, data), Options).ReplaceLineEndings("\n") + "\n";

    /// <summary>Parses report data; throws <see cref="InputException"/> naming <paramref name="sourceName"/>, line and position on bad input.</summary>
    public static ReportData FromJson(string json, string sourceName)
    {
        Envelope? env;
        try
        {
            env = JsonSerializer.Deserialize<Envelope>(json, Options);
        }
        catch (JsonException ex)
        {
            throw new InputException($"not valid report data: {ex.Message.Split(". Path:")[0]}; re-run the study to write it again",
                sourceName, ex.LineNumber + 1, ex.BytePositionInLine is { } b ? (b + 1).ToString(System.Globalization.CultureInfo.InvariantCulture) : null, ex);
        }
        if (env is null || env.Report is null) throw new InputException("report data file is empty; re-run the study to write it again", sourceName);
        if (env.FormatVersion != FormatVersion)
            throw new InputException($"report data format {env.FormatVersion} is not the supported format {FormatVersion}; re-run the study with this SizeTest version", sourceName);
        return env.Report;
    }

    /// <summary>Reads <paramref name="path"/>; a missing file is an <see cref="InputException"/>.</summary>
    public static ReportData Load(string path)
    {
        if (!File.Exists(path))
            throw new InputException($"no {FileName} here; pass the folder a study run wrote (it holds {FileName} and results.json)", path);
        return FromJson(File.ReadAllText(path), path);
    }
}

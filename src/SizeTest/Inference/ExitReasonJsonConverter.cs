using System.Text.Json;
using System.Text.Json.Serialization;

namespace SizeTest.Inference;

/// <summary>An <see cref="ExitReason"/> is written as its sentence and read back with <see cref="ExitCause.Recorded"/>.</summary>
public sealed class ExitReasonJsonConverter : JsonConverter<ExitReason>
{
    /// <inheritdoc/>
    public override ExitReason Read(ref Utf8JsonReader reader, Type typeToConvert, JsonSerializerOptions options) =>
        ExitReason.FromText(reader.GetString() ?? "");

    /// <inheritdoc/>
    public override void Write(Utf8JsonWriter writer, ExitReason value, JsonSerializerOptions options)
    {
        ArgumentNullException.ThrowIfNull(writer);
        ArgumentNullException.ThrowIfNull(value);
        writer.WriteStringValue(value.Text);
    }
}

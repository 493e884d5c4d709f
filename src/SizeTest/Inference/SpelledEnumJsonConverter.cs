using System.Text.Json;
using System.Text.Json.Serialization;
using SizeTest.Foundation.Text;

namespace SizeTest.Inference;

/// <summary>
/// Writes an enum of the fit vocabulary (<see cref="ObservableKind"/>, <see cref="SamplerKind"/>) as its one spelling
/// (the same word as on the command line and in study files) and reads it back; an unknown word is a
/// <see cref="JsonException"/>. Each enum names its converter in a <see cref="JsonConverterAttribute"/>, so results.json,
/// power.json and report-data.json all write the same word.
/// </summary>
/// <typeparam name="T">The enum.</typeparam>
/// <param name="spellings">The one spelling of each value.</param>
public abstract class SpelledEnumJsonConverter<T>(Spellings<T> spellings) : JsonConverter<T>
    where T : struct, Enum
{
    /// <inheritdoc/>
    public override T Read(ref Utf8JsonReader reader, Type typeToConvert, JsonSerializerOptions options)
    {
        string? word = reader.TokenType == JsonTokenType.String ? reader.GetString() : null;
        return spellings.TryParse(word, out var kind) ? kind
            : throw new JsonException($"'{word}' is not one of {string.Join(", ", spellings.Names)}");
    }

    /// <inheritdoc/>
    public override void Write(Utf8JsonWriter writer, T value, JsonSerializerOptions options)
    {
        ArgumentNullException.ThrowIfNull(writer);
        writer.WriteStringValue(spellings.Name(value));
    }
}

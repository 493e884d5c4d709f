using System.Text.Json;
using System.Text.Json.Serialization;

namespace SizeTest.Inference;

/// <summary>
/// Reads and writes <c>results.json</c>: snake_case keys, indented, non-finite numbers as <c>null</c>, and each
/// model's <c>parameters</c> as an object keyed by parameter name with
/// <c>{value, lo, hi, fixed, unit, interval_method, at_bound, regions}</c>.
/// Output is deterministic: the same <see cref="FitResult"/> always gives the same bytes.
/// </summary>
public static class ResultsJson
{
    /// <summary>The serializer options used for results.json.</summary>
    public static JsonSerializerOptions Options { get; } = CreateOptions();

    private static JsonSerializerOptions CreateOptions()
    {
        var o = new JsonSerializerOptions
        {
            PropertyNamingPolicy = JsonNamingPolicy.SnakeCaseLower,
            WriteIndented = true,
            DefaultIgnoreCondition = JsonIgnoreCondition.Never,
        };
        o.Converters.Add(new FiniteDoubleConverter());
        o.Converters.Add(new ParameterListConverter());
        // ObservableKind, SamplerKind and ExitReason name their own converters (one spelling in every JSON file);
        // these go first so that the generic enum converter below does not take them.
        o.Converters.Add(new ObservableKinds.JsonConverter());
        o.Converters.Add(new SamplerKinds.JsonConverter());
        o.Converters.Add(new JsonStringEnumConverter(JsonNamingPolicy.SnakeCaseLower));
        o.MakeReadOnly(populateMissingResolver: true);
        return o;
    }

    /// <summary>Serialises a study (with a trailing newline).</summary>
    public static string Serialize(FitResult result) => JsonSerializer.Serialize(result, Options) + "\n";

    /// <summary>Reads a results.json written by <see cref="Serialize"/>.</summary>
    public static FitResult Deserialize(string json) =>
        JsonSerializer.Deserialize<FitResult>(json, Options) ?? throw new JsonException("results.json is empty");

    private sealed class FiniteDoubleConverter : JsonConverter<double>
    {
        public override bool HandleNull => true;
        public override double Read(ref Utf8JsonReader reader, Type typeToConvert, JsonSerializerOptions options) =>
            reader.TokenType == JsonTokenType.Null ? double.NaN : reader.GetDouble();
        public override void Write(Utf8JsonWriter writer, double value, JsonSerializerOptions options)
        {
            if (double.IsFinite(value)) writer.WriteNumberValue(value);
            else writer.WriteNullValue();
        }
    }

    private sealed class ParameterListConverter : JsonConverter<IReadOnlyList<ParameterEstimate>>
    {
        public override IReadOnlyList<ParameterEstimate> Read(ref Utf8JsonReader reader, Type typeToConvert, JsonSerializerOptions options)
        {
            var list = new List<ParameterEstimate>();
            using var doc = JsonDocument.ParseValue(ref reader);
            foreach (var p in doc.RootElement.EnumerateObject())
            {
                double D(string k) => p.Value.TryGetProperty(k, out var e) && e.ValueKind == JsonValueKind.Number ? e.GetDouble() : double.NaN;
                bool isFixed = p.Value.TryGetProperty("fixed", out var f) && f.GetBoolean();
                string? S(string k) => p.Value.TryGetProperty(k, out var e) && e.ValueKind == JsonValueKind.String ? e.GetString() : null;
                var regions = new List<IntervalPiece>();
                if (p.Value.TryGetProperty("regions", out var rg) && rg.ValueKind == JsonValueKind.Array)
                    foreach (var r in rg.EnumerateArray())
                        if (r.ValueKind == JsonValueKind.Array && r.GetArrayLength() == 2)
                            regions.Add(new IntervalPiece(r[0].ValueKind == JsonValueKind.Number ? r[0].GetDouble() : double.NaN, r[1].ValueKind == JsonValueKind.Number ? r[1].GetDouble() : double.NaN));
                list.Add(new ParameterEstimate(p.Name, D("value"), D("lo"), D("hi"), isFixed, S("unit") ?? "",
                    S("interval_method") ?? (isFixed ? IntervalMethods.Fixed : IntervalMethods.Hessian), S("at_bound")) { Regions = regions });
            }
            return list;
        }

        public override void Write(Utf8JsonWriter writer, IReadOnlyList<ParameterEstimate> value, JsonSerializerOptions options)
        {
            writer.WriteStartObject();
            foreach (var p in value)
            {
                writer.WritePropertyName(p.Name);
                writer.WriteStartObject();
                void Num2(double v) { if (double.IsFinite(v)) writer.WriteNumberValue(v); else writer.WriteNullValue(); }
                void Num(string k, double v) { writer.WritePropertyName(k); if (double.IsFinite(v)) writer.WriteNumberValue(v); else writer.WriteNullValue(); }
                Num("value", p.Value);
                Num("lo", p.Lo);
                Num("hi", p.Hi);
                writer.WriteBoolean("fixed", p.Fixed);
                writer.WriteString("unit", p.Unit);
                writer.WriteString("interval_method", p.IntervalMethod);
                if (p.AtBound is null) writer.WriteNull("at_bound"); else writer.WriteString("at_bound", p.AtBound);
                writer.WritePropertyName("regions");
                writer.WriteStartArray();
                foreach (var r in p.Regions) { writer.WriteStartArray(); Num2(r.Lo); Num2(r.Hi); writer.WriteEndArray(); }
                writer.WriteEndArray();
                writer.WriteEndObject();
            }
            writer.WriteEndObject();
        }
    }
}

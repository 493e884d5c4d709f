using SizeTest.Foundation.Text;

namespace SizeTest.Inference;

/// <summary>Which observable a hypothesis is fitted to.</summary>
[System.Text.Json.Serialization.JsonConverter(typeof(ObservableKinds.JsonConverter))]
public enum ObservableKind
{
    /// <summary>Angular size: ln θ against redshift.</summary>
    Size,
    /// <summary>Surface brightness (Tolman test): μ against redshift.</summary>
    SurfaceBrightness,
    /// <summary>Both, as a bivariate Gaussian per object (optionally linked by a size–SB relation).</summary>
    Joint,
}

/// <summary>The spellings of <see cref="ObservableKind"/> in options, study files and result files ("size", "sb", "joint").</summary>
public static class ObservableKinds
{
    /// <summary>The one spelling of each value.</summary>
    public static Spellings<ObservableKind> Spellings { get; } = new("observable", [(ObservableKind.Size, "size"), (ObservableKind.SurfaceBrightness, "sb"), (ObservableKind.Joint, "joint")]);

    /// <summary>Every value with its spelling, in display order.</summary>
    public static IReadOnlyList<(ObservableKind Kind, string Name)> All => Spellings.All;

    /// <summary>The spellings, in display order ("size", "sb", "joint").</summary>
    public static IReadOnlyList<string> Names => Spellings.Names;

    /// <summary>The spelling of <paramref name="kind"/>.</summary>
    public static string Name(this ObservableKind kind) => Spellings.Name(kind);

    /// <summary>The value spelt <paramref name="name"/> (exact, lower case), or false.</summary>
    public static bool TryParse(string? name, out ObservableKind kind) => Spellings.TryParse(name, out kind);

    /// <summary>The value spelt <paramref name="name"/>; an <see cref="ArgumentException"/> naming the choices otherwise.</summary>
    public static ObservableKind Parse(string name) => Spellings.Parse(name);

    /// <summary>Writes and reads the spelling in JSON files.</summary>
    public sealed class JsonConverter() : SpelledEnumJsonConverter<ObservableKind>(Spellings);
}

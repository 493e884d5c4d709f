using SizeTest.Foundation.Text;

namespace SizeTest.Inference;

/// <summary>The posterior sampler run after the maximum-likelihood fit.</summary>
[System.Text.Json.Serialization.JsonConverter(typeof(SamplerKinds.JsonConverter))]
public enum SamplerKind
{
    /// <summary>No posterior sampling (intervals from the Hessian, bootstrap or profile only).</summary>
    None,

    /// <summary>Affine-invariant ensemble MCMC (Goodman &amp; Weare 2010), see <see cref="Sampling.EnsembleSampler"/>.</summary>
    Mcmc,

    /// <summary>Nested sampling (Skilling 2006), see <see cref="Sampling.NestedSampler"/>.</summary>
    Nested,
}

/// <summary>The spellings of <see cref="SamplerKind"/> in options, study files and result files ("none", "mcmc", "nested").</summary>
public static class SamplerKinds
{
    /// <summary>The one spelling of each value.</summary>
    public static Spellings<SamplerKind> Spellings { get; } = new("sampler", [(SamplerKind.None, "none"), (SamplerKind.Mcmc, "mcmc"), (SamplerKind.Nested, "nested")]);

    /// <summary>Every value with its spelling, in display order.</summary>
    public static IReadOnlyList<(SamplerKind Kind, string Name)> All => Spellings.All;

    /// <summary>The spellings, in display order ("none", "mcmc", "nested").</summary>
    public static IReadOnlyList<string> Names => Spellings.Names;

    /// <summary>The spelling of <paramref name="kind"/>.</summary>
    public static string Name(this SamplerKind kind) => Spellings.Name(kind);

    /// <summary>The value spelt <paramref name="name"/> (exact, lower case), or false.</summary>
    public static bool TryParse(string? name, out SamplerKind kind) => Spellings.TryParse(name, out kind);

    /// <summary>The value spelt <paramref name="name"/>; an <see cref="ArgumentException"/> naming the choices otherwise.</summary>
    public static SamplerKind Parse(string name) => Spellings.Parse(name);

    /// <summary>Writes and reads the spelling in JSON files.</summary>
    public sealed class JsonConverter() : SpelledEnumJsonConverter<SamplerKind>(Spellings);
}

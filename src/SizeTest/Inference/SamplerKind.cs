namespace SizeTest.Inference;

/// <summary>The posterior sampler run after the maximum-likelihood fit.</summary>
public enum SamplerKind
{
    /// <summary>No posterior sampling (intervals from the Hessian, bootstrap or profile only).</summary>
    None,

    /// <summary>Affine-invariant ensemble MCMC (Goodman &amp; Weare 2010), see <see cref="Sampling.EnsembleSampler"/>.</summary>
    Mcmc,

    /// <summary>Nested sampling (Skilling 2006), see <see cref="Sampling.NestedSampler"/>.</summary>
    Nested,
}

/// <summary>The spellings of <see cref="SamplerKind"/> in options, study files and results.json.</summary>
public static class SamplerKinds
{
    /// <summary>Every sampler with its spelling, in display order.</summary>
    public static IReadOnlyList<(SamplerKind Kind, string Name)> All { get; } =
        [(SamplerKind.None, "none"), (SamplerKind.Mcmc, "mcmc"), (SamplerKind.Nested, "nested")];

    /// <summary>The spelling of <paramref name="kind"/> ("none", "mcmc", "nested").</summary>
    public static string Name(this SamplerKind kind) => All.First(x => x.Kind == kind).Name;

    /// <summary>The sampler spelt <paramref name="name"/> (exact, lower case), or false.</summary>
    public static bool TryParse(string? name, out SamplerKind kind)
    {
        foreach (var (k, n) in All)
            if (string.Equals(n, name, StringComparison.Ordinal)) { kind = k; return true; }
        kind = SamplerKind.None;
        return false;
    }

    /// <summary>The sampler spelt <paramref name="name"/>; an <see cref="ArgumentException"/> naming the choices otherwise.</summary>
    public static SamplerKind Parse(string name) =>
        TryParse(name, out var kind) ? kind : throw new ArgumentException($"unknown sampler '{name}'; use {string.Join(", ", All.Select(x => x.Name))}");
}

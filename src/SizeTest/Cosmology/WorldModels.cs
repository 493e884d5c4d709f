using System.Diagnostics.CodeAnalysis;

namespace SizeTest.Cosmology;

/// <summary>
/// The registry of world-model families, in the order of the command-line contract:
/// <c>lcdm</c>, <c>wcdm</c>, <c>w0wacdm</c>, <c>eds</c>, <c>milne</c>, <c>static-linear</c>,
/// <c>tired-light</c>. To add a family, define its model class and add one entry here
/// (DEVELOPERS.md, "How to add a world model").
/// </summary>
public static class WorldModels
{
    private const string FlrwDimming = "(1+z)^-4 (Tolman; every FLRW model)";
    private const string StaticDimming = "(1+z)^-n, n = dimming_exponent (default 2·luminosity_exponent = 1)";

    private static readonly ParameterSpec[] LcdmParameters =
        [WorldModelParameters.H0, WorldModelParameters.OmegaMatter, WorldModelParameters.OmegaLambda, WorldModelParameters.CmbTemperature, WorldModelParameters.EffectiveNeutrinoSpecies];

    private static readonly ParameterSpec[] WcdmParameters =
        [WorldModelParameters.H0, WorldModelParameters.OmegaMatter, WorldModelParameters.OmegaLambda, WorldModelParameters.W0, WorldModelParameters.CmbTemperature, WorldModelParameters.EffectiveNeutrinoSpecies];

    private static readonly ParameterSpec[] CplParameters =
        [WorldModelParameters.H0, WorldModelParameters.OmegaMatter, WorldModelParameters.OmegaLambda, WorldModelParameters.W0, WorldModelParameters.Wa, WorldModelParameters.CmbTemperature, WorldModelParameters.EffectiveNeutrinoSpecies];

    private static readonly ParameterSpec[] StaticParameters =
        [WorldModelParameters.H0, WorldModelParameters.LuminosityExponent, WorldModelParameters.DimmingExponent];

    /// <summary>ΛCDM, flat unless omega_lambda is given.</summary>
    public static readonly WorldModelFamily LambdaCdm = new("lcdm",
        "Cold dark matter and a cosmological constant; flat (ΩΛ = 1 − Ωm − Ωr) unless omega_lambda is given; radiation from t_cmb and n_eff.",
        true, FlrwDimming, LcdmParameters,
        (WorldModelValues v, out string? error) =>
        {
            double h0 = v[WorldModelParameters.H0], om = v[WorldModelParameters.OmegaMatter];
            double? ol = v.Optional(WorldModelParameters.OmegaLambda);
            double t = v[WorldModelParameters.CmbTemperature], nEff = v[WorldModelParameters.EffectiveNeutrinoSpecies];
            error = LambdaCdmModel.Check(h0, om, ol, t, nEff);
            return error is null ? new LambdaCdmModel(h0, om, ol, t, nEff) : null;
        });

    /// <summary>Constant-w dark energy.</summary>
    public static readonly WorldModelFamily WCdm = new("wcdm",
        "Dark energy with a constant equation of state w = w0; flat unless omega_lambda (the dark-energy density) is given.",
        true, FlrwDimming, WcdmParameters,
        (WorldModelValues v, out string? error) =>
        {
            var p = DarkEnergyParameters.TryResolve("wcdm", v[WorldModelParameters.H0], v[WorldModelParameters.OmegaMatter],
                v.Optional(WorldModelParameters.OmegaLambda), v[WorldModelParameters.W0], 0.0,
                v[WorldModelParameters.CmbTemperature], v[WorldModelParameters.EffectiveNeutrinoSpecies], includeWa: false, out error);
            return p is null ? null : new WCdmModel(p);
        });

    /// <summary>CPL dark energy w(a) = w0 + wa(1 − a).</summary>
    public static readonly WorldModelFamily W0WaCdm = new("w0wacdm",
        "Dark energy with w(a) = w0 + wa (1 − a) (Chevallier–Polarski–Linder); flat unless omega_lambda is given.",
        true, FlrwDimming, CplParameters,
        (WorldModelValues v, out string? error) =>
        {
            var p = DarkEnergyParameters.TryResolve("w0wacdm", v[WorldModelParameters.H0], v[WorldModelParameters.OmegaMatter],
                v.Optional(WorldModelParameters.OmegaLambda), v[WorldModelParameters.W0], v[WorldModelParameters.Wa],
                v[WorldModelParameters.CmbTemperature], v[WorldModelParameters.EffectiveNeutrinoSpecies], includeWa: true, out error);
            return p is null ? null : new W0WaCdmModel(p);
        });

    /// <summary>Einstein–de Sitter (Ωm = 1).</summary>
    public static readonly WorldModelFamily EinsteinDeSitter = new("eds",
        "Einstein–de Sitter: flat, matter only (Ωm = 1); closed-form distances.",
        true, FlrwDimming, [WorldModelParameters.H0],
        (WorldModelValues v, out string? error) => { error = null; return new EinsteinDeSitterModel(v[WorldModelParameters.H0]); });

    /// <summary>Milne (empty, open).</summary>
    public static readonly WorldModelFamily Milne = new("milne",
        "Milne: empty open universe (Ωm = ΩΛ = 0, Ωk = 1), E(z) = 1+z; closed-form distances.",
        true, FlrwDimming, [WorldModelParameters.H0],
        (WorldModelValues v, out string? error) => { error = null; return new MilneModel(v[WorldModelParameters.H0]); });

    /// <summary>Static Euclidean, linear Hubble law d = cz/H0.</summary>
    public static readonly WorldModelFamily StaticLinear = new("static-linear",
        "Static Euclidean space with a linear Hubble law at all z, d = cz/H0; θ = ℓ/d; D_L = d (1+z)^q.",
        false, StaticDimming, StaticParameters,
        (WorldModelValues v, out string? error) => CreateStatic(StaticDistanceLaw.Linear, v, out error));

    /// <summary>Static Euclidean, exponential tired light d = (c/H0) ln(1+z).</summary>
    public static readonly WorldModelFamily TiredLight = new("tired-light",
        "Static Euclidean space with exponential tired light, d = (c/H0) ln(1+z); θ = ℓ/d; D_L = d (1+z)^q.",
        false, StaticDimming, StaticParameters,
        (WorldModelValues v, out string? error) => CreateStatic(StaticDistanceLaw.Logarithmic, v, out error));

    /// <summary>Every family, in contract order.</summary>
    public static IReadOnlyList<IWorldModelFamily> All { get; } = [LambdaCdm, WCdm, W0WaCdm, EinsteinDeSitter, Milne, StaticLinear, TiredLight];

    /// <summary>The family names, in contract order.</summary>
    public static IReadOnlyList<string> Names { get; } = All.Select(f => f.Name).ToArray();

    /// <summary>Looks up a family by name, ignoring case (<c>LCDM</c> and <c>lcdm</c> are the same model).</summary>
    public static bool TryGet(string name, [NotNullWhen(true)] out IWorldModelFamily? family)
    {
        family = All.FirstOrDefault(f => string.Equals(f.Name, name, StringComparison.OrdinalIgnoreCase));
        return family is not null;
    }

    /// <summary>Looks up a family; unknown names throw <see cref="ArgumentException"/> listing the known ones.</summary>
    public static IWorldModelFamily Get(string name)
        => TryGet(name, out var family) ? family
            : throw new ArgumentException($"Unknown world model '{name}'{SizeTest.Foundation.Text.NameSuggestions.Hint(name, Names)}; known models are {string.Join(", ", Names)}.");

    private static IWorldModel? CreateStatic(StaticDistanceLaw law, WorldModelValues v, out string? error)
    {
        double h0 = v[WorldModelParameters.H0], q = v[WorldModelParameters.LuminosityExponent];
        double? n = v.Optional(WorldModelParameters.DimmingExponent);
        error = StaticEuclideanModel.Check(h0, q, n);
        return error is null ? new StaticEuclideanModel(law, h0, q, n) : null;
    }
}

using SizeTest.Inference;

namespace SizeTest.Inference.Comparison;

/// <summary>
/// Which blocks of the likelihood can separate the world models. The surface-brightness block models
/// μ = μ0 + 2.5 (n − b) log10(1+z) (+ a size term only with the size–SB relation), so with the evolution b free it
/// constrains only n − b: every model reaches the same maximum of that block, whatever its Tolman exponent n
/// (the selection truncation P(μ &lt; μ_lim | z) depends on the same combination). The block then carries no
/// information about the world model, unless the size–SB relation ties μ to each model's physical sizes.
/// </summary>
public static class LikelihoodBlocks
{
    /// <summary>True when the study fitted surface brightness and that block cannot separate the models.</summary>
    public static bool SurfaceBrightnessIsBlind(FitResult result)
    {
        ArgumentNullException.ThrowIfNull(result);
        var s = result.Settings;
        if (s.Observable == ObservableKind.Size || result.Models.Count == 0) return false;
        bool everyBFree = result.Models.All(m => m.Parameters.Any(p => p.Name == NuisanceParameters.Names.SbEvolution && !p.Fixed));
        return everyBFree && (s.Observable == ObservableKind.SurfaceBrightness || !s.SizeSbRelation);
    }

    /// <summary>True when nothing in the likelihood can separate the models (surface brightness alone, blind).</summary>
    public static bool NothingDiscriminates(FitResult result) =>
        result.Settings.Observable == ObservableKind.SurfaceBrightness && SurfaceBrightnessIsBlind(result);

    /// <summary>The sentence that says which block decides, or null when every fitted block can discriminate.</summary>
    public static string? Note(FitResult result)
    {
        if (!SurfaceBrightnessIsBlind(result)) return null;
        return result.Settings.Observable == ObservableKind.SurfaceBrightness
            ? "Surface brightness cannot separate the models while sb_evolution is free (it constrains only n − b), so the data cannot decide; fix or bound sb_evolution, or fit sizes too."
            : "Surface brightness cannot separate the models while sb_evolution is free and μ is not linked to size, so the ranking comes from sizes alone.";
    }
}

namespace SizeTest.Inference;

/// <summary>
/// A check of the fitted physical size scale R0 (kpc) against the sizes real objects have: a galaxy's half-light radius is
/// ~0.1–30 kpc and a compact radio source's characteristic length ~1–100 pc (ℓ_m ≈ 11 pc, Cao et al. 2017), so a fitted
/// R0 outside [10⁻³, 10²] kpc in every model points at sizes read in the wrong unit — a slip the catalogue's median-angle
/// check cannot see when it is only a factor 60 (arcmin read as arcsec, or the reverse).
/// </summary>
public static class PhysicalSizePlausibility
{
    /// <summary>Smallest plausible fitted R0 (kpc): 1 pc, below the compact radio sources' scale.</summary>
    public const double MinKpc = 1e-3;

    /// <summary>Largest plausible fitted R0 (kpc): 100 kpc, above any galaxy's half-light radius.</summary>
    public const double MaxKpc = 100;

    /// <summary>The note (or null) for fitted models <paramref name="models"/>: only when every model's every R0 parameter
    /// lies outside [<see cref="MinKpc"/>, <see cref="MaxKpc"/>] on the same side (one model alone may need an odd scale).</summary>
    public static string? Note(IReadOnlyList<ModelFitSummary> models)
    {
        ArgumentNullException.ThrowIfNull(models);
        var r0 = models.SelectMany(m => m.Parameters.Where(p => IsSizeScale(p.Name) && double.IsFinite(p.Value)).Select(p => (Model: m.Name, p.Name, p.Value))).ToArray();
        if (r0.Length == 0 || models.Any(m => !m.Parameters.Any(p => IsSizeScale(p.Name)))) return null;
        bool tooLarge = r0.All(p => p.Value > MaxKpc), tooSmall = r0.All(p => p.Value < MinKpc);
        if (!tooLarge && !tooSmall) return null;
        string values = string.Join(", ", r0.Select(p => FormattableString.Invariant($"{p.Model} {p.Name} = {p.Value:G3} kpc")));
        return tooLarge
            ? $"the fitted physical size scale is larger than any galaxy or compact radio source in every model ({values}; real objects are below {MaxKpc:G3} kpc): check the unit of the size column (a factor 60 is arcmin read as arcsec)"
            : $"the fitted physical size scale is smaller than any measured object in every model ({values}; real objects are above {MinKpc * 1000:G3} pc): check the unit of the size column (a factor 60 is arcsec read as arcmin, 1000 is mas read as arcsec)";
    }

    // r0_kpc, its per-group (r0_kpc@early) and per-bin (r0_kpc_bin2) forms.
    private static bool IsSizeScale(string name) => name.StartsWith(NuisanceParameters.Names.R0Kpc, StringComparison.Ordinal);
}

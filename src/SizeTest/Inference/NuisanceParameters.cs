using SizeTest.Cosmology;

namespace SizeTest.Inference;

/// <summary>
/// The non-cosmological parameters of the size and surface-brightness models, with the
/// names used in <c>results.json</c>. Ranges are wide physical bounds; fits may narrow them.
/// </summary>
public static class NuisanceParameters
{
    /// <summary>The parameter names as constants (for <c>switch</c> cases and attribute arguments); the specs below use them.</summary>
    public static class Names
    {
        /// <summary><c>r0_kpc</c>.</summary>
        public const string R0Kpc = "r0_kpc";
        /// <summary><c>size_evolution</c>.</summary>
        public const string SizeEvolution = "size_evolution";
        /// <summary><c>scatter_dex</c>.</summary>
        public const string ScatterDex = "scatter_dex";
        /// <summary><c>mu0</c>.</summary>
        public const string Mu0 = "mu0";
        /// <summary><c>sb_evolution</c>.</summary>
        public const string SbEvolution = "sb_evolution";
        /// <summary><c>scatter_mag</c>.</summary>
        public const string ScatterMag = "scatter_mag";
        /// <summary><c>kormendy_slope</c>.</summary>
        public const string KormendySlope = "kormendy_slope";
        /// <summary><c>size_luminosity_slope</c>.</summary>
        public const string SizeLuminositySlope = "size_luminosity_slope";
        /// <summary><c>sb_luminosity_slope</c>.</summary>
        public const string SbLuminositySlope = "sb_luminosity_slope";
    }

    /// <summary>R0: physical size at z = 0 in kpc, in R(z) = R0 (1+z)^a. Degenerate with H0 for sizes (only R0·H0 is constrained).</summary>
    public static readonly ParameterSpec R0Kpc = new(Names.R0Kpc, "R0", "kpc", 5.0, 1e-4, 1e4,
        "physical size at z = 0, R(z) = R0 (1+z)^a");

    /// <summary>a: size-evolution exponent in R ∝ (1+z)^a (a &lt; 0: smaller in the past).</summary>
    public static readonly ParameterSpec SizeEvolution = new(Names.SizeEvolution, "a", "", 0.0, -6.0, 6.0,
        "size evolution exponent a in R ∝ (1+z)^a");

    /// <summary>Intrinsic log-normal size scatter in dex (σ_ln = ln 10 · dex).</summary>
    public static readonly ParameterSpec ScatterDex = new(Names.ScatterDex, "σ_R", "dex", 0.2, 1e-4, 3.0,
        "intrinsic scatter of log10 size");

    /// <summary>μ0: surface brightness at z = 0 (at the pivot size in the joint model with a size–SB relation), mag/arcsec².</summary>
    public static readonly ParameterSpec Mu0 = new(Names.Mu0, "μ0", "mag/arcsec2", 21.0, -10.0, 50.0,
        "surface brightness at z = 0");

    /// <summary>b: surface-brightness (luminosity) evolution exponent, Δμ = −2.5 b log10(1+z) (b &gt; 0: brighter in the past).</summary>
    public static readonly ParameterSpec SbEvolution = new(Names.SbEvolution, "b", "", 0.0, -10.0, 10.0,
        "surface-brightness evolution exponent b, Δμ = −2.5 b log10(1+z)");

    /// <summary>Intrinsic surface-brightness scatter in mag.</summary>
    public static readonly ParameterSpec ScatterMag = new(Names.ScatterMag, "σ_μ", "mag", 0.3, 1e-4, 5.0,
        "intrinsic scatter of surface brightness");

    /// <summary>Kormendy-type slope: dμ/dlog10 R at fixed redshift, mag/arcsec² per dex of physical size.</summary>
    public static readonly ParameterSpec KormendySlope = new(Names.KormendySlope, "κ", "mag/dex", 0.0, -20.0, 20.0,
        "slope of μ against log10 physical size (Kormendy-type relation)");

    /// <summary>β in R ∝ (L/L_pivot)^β (or (M/M_pivot)^β): the size–luminosity (size–mass) slope; radio ℓ ∝ L^β.</summary>
    public static readonly ParameterSpec SizeLuminositySlope = new(Names.SizeLuminositySlope, "β", "", 0.0, -3.0, 3.0,
        "slope β of the size–luminosity (or size–mass) relation R ∝ L^β");

    /// <summary>
    /// γ in the joint fit with a size–luminosity (size–mass) relation: the surface brightness is conditional on the luminosity too,
    /// Δμ = −2.5 γ log10(L/L_pivot) (= γ (M − M_pivot) in absolute magnitudes). Where μ = m + 5 log10 θ + 2.5 log10 2π comes from
    /// the same photometry as L, μ = M + 5 log10 R + 5 log10(D_L/D_A) + const, so with R ∝ L^β (and no Kormendy term) γ = 1 − 2β.
    /// </summary>
    public static readonly ParameterSpec SbLuminositySlope = new(Names.SbLuminositySlope, "γ", "mag/mag", 0.0, -5.0, 5.0,
        "slope γ of surface brightness against absolute magnitude, Δμ = −2.5 γ log10(L/L_pivot)");

    /// <summary>All nuisance parameters of the basic models, in reporting order.</summary>
    public static IReadOnlyList<ParameterSpec> All { get; } = [R0Kpc, SizeEvolution, ScatterDex, Mu0, SbEvolution, ScatterMag, KormendySlope];

    /// <summary>
    /// Nuisance parameters of <paramref name="nuisance"/>, including its survey terms: per group (<c>NAME@GROUP</c>) R0 (per
    /// redshift bin <c>r0_kpc_binK</c> with binned evolution, which drops <c>size_evolution</c>), a, scatter and β; with surface
    /// brightness (sb, joint) also μ0 (per bin <c>mu0_binK</c>, dropping <c>sb_evolution</c>), b and the SB scatter, and in joint fits with a
    /// size relation γ (<c>sb_luminosity_slope</c>); the size–SB slope
    /// <c>kormendy_slope</c> stays shared.
    /// </summary>
    public static IReadOnlyList<ParameterSpec> For(NuisanceModel nuisance)
    {
        ArgumentNullException.ThrowIfNull(nuisance);
        var sv = nuisance.SurveyTerms;
        if (!sv.IsActive) return For(nuisance.Observable, nuisance.SizeSbRelation);
        var list = new List<ParameterSpec>();
        bool size = nuisance.Observable != ObservableKind.SurfaceBrightness, sb = nuisance.Observable != ObservableKind.Size;
        foreach (var g in sv.GroupLabels)
        {
            string suffix = g.Length == 0 ? "" : $" ({g})";
            if (!size) { /* surface brightness alone: no size parameters */ }
            else if (sv.Binned)
                for (int k = 1; k <= sv.BinCount; k++)
                    list.Add(R0Kpc with { Name = Survey.SurveyModel.Named($"r0_kpc_bin{k}", g), Description = $"physical size in redshift bin {k}{suffix}" });
            else
            {
                list.Add(R0Kpc with { Name = Survey.SurveyModel.Named(R0Kpc.Name, g), Description = R0Kpc.Description + suffix });
                list.Add(SizeEvolution with { Name = Survey.SurveyModel.Named(SizeEvolution.Name, g), Description = SizeEvolution.Description + suffix });
            }
            if (size)
            {
                list.Add(ScatterDex with { Name = Survey.SurveyModel.Named(ScatterDex.Name, g), Description = ScatterDex.Description + suffix });
                if (sv.Relation != Survey.SizeRelationKind.None)
                    list.Add(SizeLuminositySlope with { Name = Survey.SurveyModel.Named(SizeLuminositySlope.Name, g), Description = SizeLuminositySlope.Description + suffix });
            }
            if (!sb) continue;
            if (sv.Binned)
                for (int k = 1; k <= sv.BinCount; k++)
                    list.Add(Mu0 with { Name = Survey.SurveyModel.Named($"mu0_bin{k}", g), Description = $"surface brightness in redshift bin {k}, dimming removed{suffix}" });
            else
            {
                list.Add(Mu0 with { Name = Survey.SurveyModel.Named(Mu0.Name, g), Description = Mu0.Description + suffix });
                list.Add(SbEvolution with { Name = Survey.SurveyModel.Named(SbEvolution.Name, g), Description = SbEvolution.Description + suffix });
            }
            list.Add(ScatterMag with { Name = Survey.SurveyModel.Named(ScatterMag.Name, g), Description = ScatterMag.Description + suffix });
            if (size && sv.Relation != Survey.SizeRelationKind.None)
                list.Add(SbLuminositySlope with { Name = Survey.SurveyModel.Named(SbLuminositySlope.Name, g), Description = SbLuminositySlope.Description + suffix });
        }
        if (nuisance.SizeSbRelation) list.Add(KormendySlope);
        return list;
    }

    /// <summary>Whether <paramref name="name"/> is a survey-term parameter (β, per-group or per-bin names).</summary>
    public static bool IsSurveyName(string name) =>
        name.StartsWith(SizeLuminositySlope.Name, StringComparison.Ordinal) || name.StartsWith(SbLuminositySlope.Name, StringComparison.Ordinal) || name.Contains('@', StringComparison.Ordinal) || name.StartsWith("r0_kpc_bin", StringComparison.Ordinal)
        || name.StartsWith("mu0_bin", StringComparison.Ordinal);

    /// <summary>Nuisance parameters that enter the likelihood for the given observable.</summary>
    public static IReadOnlyList<ParameterSpec> For(ObservableKind kind, bool sizeSbRelation) => kind switch
    {
        ObservableKind.Size => [R0Kpc, SizeEvolution, ScatterDex],
        ObservableKind.SurfaceBrightness => [Mu0, SbEvolution, ScatterMag],
        _ => sizeSbRelation
            ? [R0Kpc, SizeEvolution, ScatterDex, Mu0, SbEvolution, ScatterMag, KormendySlope]
            : [R0Kpc, SizeEvolution, ScatterDex, Mu0, SbEvolution, ScatterMag],
    };
}

namespace SizeTest.Cosmology;

/// <summary>
/// The parameters of the world-model families. The names become command-line options
/// (<c>omega_m</c> → <c>--omega-m</c>) and fit-parameter names.
/// </summary>
public static class WorldModelParameters
{
    /// <summary>The parameter names as constants (for <c>switch</c> cases and attribute arguments); the specs below use them.</summary>
    public static class Names
    {
        /// <summary><c>h0</c>.</summary>
        public const string H0 = "h0";
        /// <summary><c>omega_m</c>.</summary>
        public const string OmegaMatter = "omega_m";
        /// <summary><c>omega_lambda</c>.</summary>
        public const string OmegaLambda = "omega_lambda";
        /// <summary><c>w0</c>.</summary>
        public const string W0 = "w0";
        /// <summary><c>wa</c>.</summary>
        public const string Wa = "wa";
        /// <summary><c>t_cmb</c>.</summary>
        public const string CmbTemperature = "t_cmb";
        /// <summary><c>n_eff</c>.</summary>
        public const string EffectiveNeutrinoSpecies = "n_eff";
        /// <summary><c>dimming_exponent</c>.</summary>
        public const string DimmingExponent = "dimming_exponent";
        /// <summary><c>luminosity_exponent</c>.</summary>
        public const string LuminosityExponent = "luminosity_exponent";
    }

    /// <summary>Hubble constant H0 (km/s/Mpc), default 70.</summary>
    public static readonly ParameterSpec H0 = new(Names.H0, "H0", "km/s/Mpc", 70, 10, 300, "Hubble constant today");

    /// <summary>Matter density Ωm today, default 0.3.</summary>
    public static readonly ParameterSpec OmegaMatter = new(Names.OmegaMatter, "Ωm", "", 0.3, 0, 5, "matter density today (baryons + cold dark matter)");

    /// <summary>Dark-energy density today; default "not given" (NaN) = flat, 1 − Ωm − Ωr.</summary>
    public static readonly ParameterSpec OmegaLambda = new(Names.OmegaLambda, "ΩΛ", "", double.NaN, -5, 5, "dark-energy (Λ) density today; not given = flat: 1 − Ωm − Ωr");

    /// <summary>Dark-energy equation of state today, default −1.</summary>
    public static readonly ParameterSpec W0 = new(Names.W0, "w0", "", -1, -3, 1, "dark-energy equation of state p/ρc² today (constant in wcdm)");

    /// <summary>CPL slope wa, default 0.</summary>
    public static readonly ParameterSpec Wa = new(Names.Wa, "wa", "", 0, -5, 5, "CPL slope: w(a) = w0 + wa (1 − a)");

    /// <summary>CMB temperature today (K), default 0 = no radiation.</summary>
    public static readonly ParameterSpec CmbTemperature = new(Names.CmbTemperature, "T_CMB", "K", 0, 0, 20, "CMB temperature today; 0 = no radiation (2.7255 K: Fixsen 2009)");

    /// <summary>Effective number of massless neutrino species, default 3.04.</summary>
    public static readonly ParameterSpec EffectiveNeutrinoSpecies = new(Names.EffectiveNeutrinoSpecies, "N_eff", "", 3.04, 0, 10, "effective number of (massless) neutrino species; used only when t_cmb > 0");

    /// <summary>Static models: bolometric SB dimming exponent n; default "not given" = 2q.</summary>
    public static readonly ParameterSpec DimmingExponent = new(Names.DimmingExponent, "n", "", double.NaN, -10, 10, "bolometric surface-brightness dimming (1+z)^-n; not given = 2·luminosity_exponent (1 for energy loss only)");

    /// <summary>Static models: D_L = d (1+z)^q; default 0.5 (energy loss only).</summary>
    public static readonly ParameterSpec LuminosityExponent = new(Names.LuminosityExponent, "q", "", 0.5, 0, 3, "flux convention D_L = d (1+z)^q: 0.5 energy loss only, 1 also time dilation");
}

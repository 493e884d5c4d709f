
namespace SizeTest.Catalogues;

/// <summary>
/// Units of the survey roles <c>flux_density</c> and <c>log_mass</c> (the others reuse <see cref="CatalogueUnits"/>).
/// Flux densities are stored in Jy (1 Jy = 10⁻²⁶ W m⁻² Hz⁻¹ = 10⁻²³ erg s⁻¹ cm⁻² Hz⁻¹; IAU/CGS definition), stellar
/// masses as log10(M/M_⊙).
/// </summary>
public static class SurveyRoleUnits
{
    private static string Squash(string unit) => new string(unit.Trim().ToLowerInvariant().Where(c => !char.IsWhiteSpace(c)).ToArray());

    /// <summary>
    /// Parses a flux-density unit: <c>Jy</c>, <c>mJy</c>, <c>uJy</c>/<c>µJy</c>/<c>muJy</c>, <c>nJy</c>, <c>W/m2/Hz</c>
    /// (<c>W.m-2.Hz-1</c>), <c>erg/s/cm2/Hz</c> (<c>erg.s-1.cm-2.Hz-1</c>); <paramref name="jyPerUnit"/> converts to Jy.
    /// </summary>
    public static bool TryParseFluxDensity(string? unit, out double jyPerUnit, out string canonical)
    {
        jyPerUnit = 0;
        canonical = "";
        if (string.IsNullOrWhiteSpace(unit)) return false;
        var u = Squash(unit).Replace("µ", "u").Replace("μ", "u");
        (jyPerUnit, canonical) = u switch
        {
            "jy" => (1.0, "Jy"),
            "mjy" => (1e-3, "mJy"),
            "ujy" or "mujy" => (1e-6, "uJy"),
            "njy" => (1e-9, "nJy"),
            "w/m2/hz" or "w/m^2/hz" or "w.m-2.hz-1" or "wm-2hz-1" or "w/(m2hz)" or "w/(m2.hz)" => (1e26, "W/m2/Hz"),
            "erg/s/cm2/hz" or "erg/s/cm^2/hz" or "erg.s-1.cm-2.hz-1" or "ergs-1cm-2hz-1" => (1e23, "erg/s/cm2/Hz"),
            _ => (0.0, ""),
        };
        return jyPerUnit > 0;
    }

    /// <summary>
    /// Whether a unit marks log10 of a mass in solar masses: <c>dex</c>, <c>log(Msun)</c>, <c>[Msun]</c>,
    /// <c>log(solMass)</c>, <c>dex(solMass)</c>, <c>log10(Msun)</c>, or no unit.
    /// </summary>
    public static bool IsLogSolarMass(string? unit)
    {
        if (string.IsNullOrWhiteSpace(unit)) return true;
        var u = Squash(unit).Replace("_", "").Replace("msol", "msun").Replace("solmass", "msun").Replace("m_sun", "msun");
        return u is "dex" or "log(msun)" or "log10(msun)" or "[msun]" or "dex(msun)" or "log" or "logmsun" or "log(m/msun)" or "[m/msun]" or "log(mstar/msun)";
    }

    /// <summary>Whether a unit is a linear solar mass (refused for <c>log_mass</c> with a hint).</summary>
    public static bool IsLinearSolarMass(string? unit)
    {
        if (string.IsNullOrWhiteSpace(unit)) return false;
        var u = Squash(unit).Replace("_", "");
        return u is "msun" or "solmass" or "msol" or "m_sun";
    }
}

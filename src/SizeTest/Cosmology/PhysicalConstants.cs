namespace SizeTest.Cosmology;

/// <summary>
/// Physical and astronomical constants used by the world models, each with its source.
/// All values are exact by definition except <see cref="GravitationalConstant"/> (CODATA 2018).
/// </summary>
public static class PhysicalConstants
{
    /// <summary>Speed of light in vacuum, c = 299 792.458 km/s (exact; SI definition of the metre, 1983/2019).</summary>
    public const double SpeedOfLightKmPerS = 299792.458;

    /// <summary>Astronomical unit in km, 149 597 870.700 km (exact; IAU 2012 Resolution B2).</summary>
    public const double AstronomicalUnitKm = 149597870.700;

    /// <summary>
    /// Parsec in km: 648000/π au (exact; IAU 2015 Resolution B2) ≈ 3.0856775814913673e13 km.
    /// </summary>
    public const double ParsecKm = 648000.0 / Math.PI * AstronomicalUnitKm;

    /// <summary>Megaparsec in km, 10^6 pc ≈ 3.0856775814913673e19 km.</summary>
    public const double MegaparsecKm = 1e6 * ParsecKm;

    /// <summary>Megaparsec in metres.</summary>
    public const double MegaparsecM = 1e3 * MegaparsecKm;

    /// <summary>Julian year in seconds, 365.25 d × 86 400 s = 31 557 600 s (exact; IAU definition).</summary>
    public const double JulianYearS = 365.25 * 86400.0;

    /// <summary>Seconds per gigayear (10^9 Julian years).</summary>
    public const double GigayearS = 1e9 * JulianYearS;

    /// <summary>
    /// Hubble time for H0 = 1 km/s/Mpc in Gyr: t_H = 1/H0 = (Mpc/km) s / (s per Gyr)
    /// = 3.0856775814913673e19 / 3.15576e16 ≈ 977.7922216807891 Gyr; so t_H = 977.792/H0 Gyr.
    /// </summary>
    public const double HubbleTimeGyrTimesH0 = MegaparsecKm / GigayearS;

    /// <summary>Newtonian constant of gravitation G = 6.67430e-11 m³ kg⁻¹ s⁻² (CODATA 2018).</summary>
    public const double GravitationalConstant = 6.67430e-11;

    /// <summary>
    /// Stefan–Boltzmann constant σ = 5.670374419e-8 W m⁻² K⁻⁴ (exact since the 2019 SI,
    /// σ = 2π⁵k⁴/(15h³c²); CODATA 2018 value).
    /// </summary>
    public const double StefanBoltzmann = 5.670374419e-8;

    /// <summary>Speed of light in m/s (exact).</summary>
    public const double SpeedOfLightMPerS = 299792458.0;

    /// <summary>
    /// Ratio of the energy density of one species of massless neutrino to that of photons
    /// after electron–positron annihilation: (7/8)(4/11)^(4/3) ≈ 0.2271 (standard thermal
    /// history; Kolb &amp; Turner 1990, eq. 3.94; the same factor astropy uses for massless ν).
    /// </summary>
    public static readonly double NeutrinoPhotonDensityRatio = 7.0 / 8.0 * Math.Pow(4.0 / 11.0, 4.0 / 3.0);

    /// <summary>
    /// Photon density parameter Ωγ for CMB temperature <paramref name="tCmbK"/> and Hubble
    /// constant <paramref name="h0"/>: Ωγ = ρ_γ/ρ_crit with ρ_γ c² = (4σ/c) T⁴ and
    /// ρ_crit = 3H0²/(8πG); this gives Ωγh² = 2.47e-5 for T = 2.7255 K.
    /// </summary>
    /// <param name="tCmbK">CMB temperature today in K (0 = no radiation).</param>
    /// <param name="h0">Hubble constant in km/s/Mpc.</param>
    public static double PhotonDensity(double tCmbK, double h0)
    {
        double h0PerS = h0 / MegaparsecKm;
        double criticalDensityKgM3 = 3.0 * h0PerS * h0PerS / (8.0 * Math.PI * GravitationalConstant);
        double c = SpeedOfLightMPerS;
        double photonMassDensity = 4.0 * StefanBoltzmann / (c * c * c) * Math.Pow(tCmbK, 4);
        return photonMassDensity / criticalDensityKgM3;
    }

    /// <summary>
    /// Radiation density parameter with massless neutrinos:
    /// Ωr = Ωγ (1 + (7/8)(4/11)^(4/3) N_eff) (the convention of astropy's FLRW classes with m_ν = 0).
    /// </summary>
    /// <param name="tCmbK">CMB temperature today in K (0 = no radiation).</param>
    /// <param name="nEff">Effective number of neutrino species (3.04 standard).</param>
    /// <param name="h0">Hubble constant in km/s/Mpc.</param>
    public static double RadiationDensity(double tCmbK, double nEff, double h0)
        => PhotonDensity(tCmbK, h0) * (1.0 + NeutrinoPhotonDensityRatio * nEff);
}

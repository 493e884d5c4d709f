namespace SizeTest.Cosmology;

/// <summary>
/// Dark energy with the Chevallier–Polarski–Linder equation of state w(a) = w0 + wa(1 − a)
/// (Chevallier &amp; Polarski 2001, IJMPD 10, 213; Linder 2003, PRL 90, 091301), whose density
/// evolves as f(z) = (1+z)^{3(1+w0+wa)} exp(−3 wa z/(1+z)); E²(z) = Ωr(1+z)⁴ + Ωm(1+z)³ +
/// Ωk(1+z)² + Ω_DE f(z). Flat unless Ω_DE (omega_lambda) is given.
/// </summary>
public sealed class W0WaCdmModel : FlrwModel
{
    private readonly double _r, _m, _k, _de, _p, _wa3;

    /// <summary>Builds a CPL model.</summary>
    /// <param name="hubbleConstant">H0 in km/s/Mpc.</param>
    /// <param name="omegaMatter">Ωm ≥ 0.</param>
    /// <param name="w0">w today.</param>
    /// <param name="wa">Slope wa of w(a) = w0 + wa(1 − a).</param>
    /// <param name="omegaDarkEnergy">Ω_DE; null for a flat model (1 − Ωm − Ωr).</param>
    /// <param name="cmbTemperatureK">T_CMB in K; 0 = no radiation.</param>
    /// <param name="effectiveNeutrinoSpecies">N_eff (massless neutrinos).</param>
    /// <exception cref="ArgumentException">Invalid values or no big bang.</exception>
    public W0WaCdmModel(double hubbleConstant = 70, double omegaMatter = 0.3, double w0 = -1, double wa = 0, double? omegaDarkEnergy = null, double cmbTemperatureK = 0, double effectiveNeutrinoSpecies = 3.04)
        : this(DarkEnergyParameters.Resolve("w0wacdm", hubbleConstant, omegaMatter, omegaDarkEnergy, w0, wa, cmbTemperatureK, effectiveNeutrinoSpecies, includeWa: true))
    {
    }

    /// <summary>Builds from parameters already resolved and checked (the family's no-exception path).</summary>
    internal W0WaCdmModel(DarkEnergyParameters p)
        : base("w0wacdm", p.H0, p.OmegaM, p.OmegaR, p.OmegaDe, p.Values, p.Flat ? 0.0 : null)
    {
        _r = OmegaRadiation;
        _m = OmegaMatter;
        _k = OmegaCurvature;
        _de = OmegaDarkEnergy;
        _p = 3.0 * (1.0 + p.W0 + p.Wa);
        _wa3 = 3.0 * p.Wa;
        W0 = p.W0;
        Wa = p.Wa;
    }

    /// <summary>w0, the equation of state today.</summary>
    public double W0 { get; }

    /// <summary>wa, the slope of w in 1 − a.</summary>
    public double Wa { get; }

    /// <inheritdoc/>
    public override double InverseHubbleFunction(double z)
    {
        double zp = 1.0 + z;
        double zp2 = zp * zp;
        double e2 = zp2 * (zp * (_r * zp + _m) + _k) + _de * Math.Pow(zp, _p) * Math.Exp(-_wa3 * z / zp);
        return e2 > 0 ? 1.0 / Math.Sqrt(e2) : double.NaN;
    }
}

namespace SizeTest.Cosmology;

/// <summary>
/// Dark energy with a constant equation of state w (wCDM), optionally curved and with
/// radiation: E²(z) = Ωr(1+z)⁴ + Ωm(1+z)³ + Ωk(1+z)² + Ω_DE(1+z)^{3(1+w)} (Hogg 1999 eq. 14
/// with the constant-w dark-energy density). Flat unless Ω_DE (omega_lambda) is given.
/// </summary>
public sealed class WCdmModel : FlrwModel
{
    private readonly double _r, _m, _k, _de, _p;

    /// <summary>Builds a wCDM model.</summary>
    /// <param name="hubbleConstant">H0 in km/s/Mpc.</param>
    /// <param name="omegaMatter">Ωm ≥ 0.</param>
    /// <param name="w">Equation of state w = p/(ρc²) of the dark energy.</param>
    /// <param name="omegaDarkEnergy">Ω_DE; null for a flat model (1 − Ωm − Ωr).</param>
    /// <param name="cmbTemperatureK">T_CMB in K; 0 = no radiation.</param>
    /// <param name="effectiveNeutrinoSpecies">N_eff (massless neutrinos).</param>
    /// <exception cref="ArgumentException">Invalid values or no big bang.</exception>
    public WCdmModel(double hubbleConstant = 70, double omegaMatter = 0.3, double w = -1, double? omegaDarkEnergy = null, double cmbTemperatureK = 0, double effectiveNeutrinoSpecies = 3.04)
        : this(DarkEnergyParameters.Resolve("wcdm", hubbleConstant, omegaMatter, omegaDarkEnergy, w, 0.0, cmbTemperatureK, effectiveNeutrinoSpecies, includeWa: false))
    {
    }

    /// <summary>Builds from parameters already resolved and checked (the family's no-exception path).</summary>
    internal WCdmModel(DarkEnergyParameters p)
        : base("wcdm", p.H0, p.OmegaM, p.OmegaR, p.OmegaDe, p.Values, p.Flat ? 0.0 : null)
    {
        _r = OmegaRadiation;
        _m = OmegaMatter;
        _k = OmegaCurvature;
        _de = OmegaDarkEnergy;
        _p = 3.0 * (1.0 + p.W0);
        EquationOfState = p.W0;
    }

    /// <summary>The dark-energy equation of state w.</summary>
    public double EquationOfState { get; }

    /// <inheritdoc/>
    public override double InverseHubbleFunction(double z)
    {
        double zp = 1.0 + z;
        double zp2 = zp * zp;
        double e2 = zp2 * (zp * (_r * zp + _m) + _k) + _de * Math.Pow(zp, _p);
        return e2 > 0 ? 1.0 / Math.Sqrt(e2) : double.NaN;
    }
}

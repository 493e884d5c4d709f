namespace SizeTest.Cosmology;

/// <summary>
/// ΛCDM: matter, radiation (optional), a cosmological constant and curvature.
/// E²(z) = Ωr(1+z)⁴ + Ωm(1+z)³ + Ωk(1+z)² + ΩΛ (Hogg 1999 eq. 14, with the standard
/// radiation term). Flat (Ωk = 0, ΩΛ = 1 − Ωm − Ωr) unless ΩΛ is given.
/// </summary>
public sealed class LambdaCdmModel : FlrwModel
{
    private readonly double _r, _m, _k, _l;

    /// <summary>Builds a ΛCDM model.</summary>
    /// <param name="hubbleConstant">H0 in km/s/Mpc.</param>
    /// <param name="omegaMatter">Ωm ≥ 0.</param>
    /// <param name="omegaLambda">ΩΛ; null for a flat model (ΩΛ = 1 − Ωm − Ωr).</param>
    /// <param name="cmbTemperatureK">T_CMB in K; 0 = no radiation.</param>
    /// <param name="effectiveNeutrinoSpecies">N_eff (massless neutrinos).</param>
    /// <exception cref="ArgumentException">Invalid values or no big bang.</exception>
    public LambdaCdmModel(double hubbleConstant = 70, double omegaMatter = 0.3, double? omegaLambda = null, double cmbTemperatureK = 0, double effectiveNeutrinoSpecies = 3.04)
        : this(Resolve(hubbleConstant, omegaMatter, omegaLambda, cmbTemperatureK, effectiveNeutrinoSpecies))
    {
    }

    private LambdaCdmModel(Resolved p)
        : base("lcdm", p.H0, p.OmegaM, p.OmegaR, p.OmegaL, p.Values, p.Flat ? 0.0 : null)
    {
        _r = OmegaRadiation;
        _m = OmegaMatter;
        _k = OmegaCurvature;
        _l = OmegaDarkEnergy;
    }

    /// <summary>True when the model was built flat (ΩΛ derived).</summary>
    public bool IsFlat => OmegaCurvature == 0.0;

    /// <inheritdoc/>
    public override double InverseHubbleFunction(double z)
    {
        double zp = 1.0 + z;
        double zp2 = zp * zp;
        double e2 = zp2 * (zp * (_r * zp + _m) + _k) + _l;
        return e2 > 0 ? 1.0 / Math.Sqrt(e2) : double.NaN;
    }

    /// <summary>Checks the values without building; returns a user message or null.</summary>
    internal static string? Check(double hubbleConstant, double omegaMatter, double? omegaLambda, double cmbTemperatureK, double effectiveNeutrinoSpecies)
    {
        if (!(hubbleConstant > 0) || !double.IsFinite(hubbleConstant)) return $"h0 must be a positive number of km/s/Mpc; got {hubbleConstant}.";
        if (!(omegaMatter >= 0) || !double.IsFinite(omegaMatter)) return $"omega_m must be finite and ≥ 0; got {omegaMatter}.";
        if (omegaLambda is { } l && !double.IsFinite(l)) return $"omega_lambda must be finite; got {l}.";
        if (!(cmbTemperatureK >= 0) || !double.IsFinite(cmbTemperatureK)) return $"t_cmb must be finite and ≥ 0 K; got {cmbTemperatureK}.";
        if (!(effectiveNeutrinoSpecies >= 0) || !double.IsFinite(effectiveNeutrinoSpecies)) return $"n_eff must be finite and ≥ 0; got {effectiveNeutrinoSpecies}.";
        double r = PhysicalConstants.RadiationDensity(cmbTemperatureK, effectiveNeutrinoSpecies, hubbleConstant);
        double lambda = omegaLambda ?? 1.0 - omegaMatter - r;
        double k = omegaLambda is null ? 0.0 : 1.0 - omegaMatter - r - lambda;
        double? zero = ExpansionHistoryCheck.PolynomialZero(r, omegaMatter, k, lambda);
        return zero is { } z
            ? ExpansionHistoryCheck.NoBigBangMessage("lcdm", FormattableString.Invariant($"omega_m = {omegaMatter:G6}, omega_lambda = {lambda:G6}"), z)
            : null;
    }

    private sealed record Resolved(double H0, double OmegaM, double OmegaR, double OmegaL, bool Flat, IReadOnlyDictionary<string, double> Values);

    private static Resolved Resolve(double h0, double om, double? ol, double t, double nEff)
    {
        if (Check(h0, om, ol, t, nEff) is { } error) throw new ArgumentException(error);
        var d = FlrwDensities.Resolve(h0, om, ol, t, nEff);
        return new Resolved(h0, om, d.OmegaRadiation, d.OmegaDarkEnergy, ol is null, d.Values);
    }
}

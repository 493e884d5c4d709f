namespace SizeTest.Cosmology;

/// <summary>
/// The density parameters shared by the FLRW models with a cosmological constant or dark-energy fluid (ΛCDM, wCDM,
/// w0waCDM): Ω_r = Ω_γ (1 + 0.2271 N_eff) from T_CMB (<see cref="PhysicalConstants.RadiationDensity"/>; docs/science.md §1.1),
/// Ω_DE = 1 − Ω_m − Ω_r when not given (flat), and the parameter values in the order the models report them.
/// </summary>
/// <param name="OmegaRadiation">Ω_r.</param>
/// <param name="OmegaDarkEnergy">Ω_Λ or Ω_DE as given, or the flat value.</param>
/// <param name="Values">h0, omega_m, omega_lambda, the dark-energy parameters given, t_cmb, n_eff.</param>
internal sealed record FlrwDensities(double OmegaRadiation, double OmegaDarkEnergy, IReadOnlyDictionary<string, double> Values)
{
    /// <summary>Resolves the densities of (H0, Ω_m, Ω_DE or null for flat, T_CMB, N_eff); <paramref name="darkEnergy"/> are the
    /// equation-of-state parameters (w0, wa) listed after omega_lambda. The values are assumed checked.</summary>
    public static FlrwDensities Resolve(double h0, double om, double? ode, double t, double nEff, params (string Name, double Value)[] darkEnergy)
    {
        double r = PhysicalConstants.RadiationDensity(t, nEff, h0);
        double de = ode ?? 1.0 - om - r;
        var values = new Dictionary<string, double>
        {
            [WorldModelParameters.H0.Name] = h0,
            [WorldModelParameters.OmegaMatter.Name] = om,
            [WorldModelParameters.OmegaLambda.Name] = de,
        };
        foreach (var (name, value) in darkEnergy) values[name] = value;
        values[WorldModelParameters.CmbTemperature.Name] = t;
        values[WorldModelParameters.EffectiveNeutrinoSpecies.Name] = nEff;
        return new FlrwDensities(r, de, values);
    }
}

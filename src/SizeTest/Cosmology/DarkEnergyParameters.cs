namespace SizeTest.Cosmology;

/// <summary>Resolved and checked parameters of the w-dark-energy models (wCDM, CPL).</summary>
internal sealed record DarkEnergyParameters(double H0, double OmegaM, double OmegaR, double OmegaDe, double W0, double Wa, bool Flat, IReadOnlyDictionary<string, double> Values)
{
    /// <summary>Checks the values without building; returns a user message or null.</summary>
    public static string? Check(string model, double h0, double om, double? ode, double w0, double wa, double t, double nEff)
    {
        if (!(h0 > 0) || !double.IsFinite(h0)) return $"h0 must be a positive number of km/s/Mpc; got {h0}.";
        if (!(om >= 0) || !double.IsFinite(om)) return $"omega_m must be finite and ≥ 0; got {om}.";
        if (ode is { } l && !double.IsFinite(l)) return $"omega_lambda must be finite; got {l}.";
        if (!double.IsFinite(w0) || !double.IsFinite(wa)) return $"w0 and wa must be finite; got w0 = {w0}, wa = {wa}.";
        if (!(t >= 0) || !double.IsFinite(t)) return $"t_cmb must be finite and ≥ 0 K; got {t}.";
        if (!(nEff >= 0) || !double.IsFinite(nEff)) return $"n_eff must be finite and ≥ 0; got {nEff}.";
        double r = PhysicalConstants.RadiationDensity(t, nEff, h0);
        double de = ode ?? 1.0 - om - r;
        double k = ode is null ? 0.0 : 1.0 - om - r - de;
        double p = 3.0 * (1.0 + w0 + wa), wa3 = 3.0 * wa;
        double? zero = ExpansionHistoryCheck.SampledZero(x =>
        {
            double y = Math.Exp(x);
            double y2 = y * y;
            return y2 * (y * (r * y + om) + k) + de * Math.Exp(p * x - wa3 * (1.0 - 1.0 / y));
        });
        return zero is { } z
            ? ExpansionHistoryCheck.NoBigBangMessage(model, FormattableString.Invariant($"omega_m = {om:G6}, omega_lambda = {de:G6}, w0 = {w0:G6}, wa = {wa:G6}"), z)
            : null;
    }

    /// <summary>Resolves defaults (flat when <paramref name="ode"/> is null), checks, and throws on error.</summary>
    public static DarkEnergyParameters Resolve(string model, double h0, double om, double? ode, double w0, double wa, double t, double nEff, bool includeWa)
        => TryResolve(model, h0, om, ode, w0, wa, t, nEff, includeWa, out string? error) ?? throw new ArgumentException(error);

    /// <summary>Resolves and checks; returns null and a message for a refused set (no exception).</summary>
    public static DarkEnergyParameters? TryResolve(string model, double h0, double om, double? ode, double w0, double wa, double t, double nEff, bool includeWa, out string? error)
    {
        error = Check(model, h0, om, ode, w0, wa, t, nEff);
        if (error is not null) return null;
        var d = includeWa
            ? FlrwDensities.Resolve(h0, om, ode, t, nEff, (WorldModelParameters.W0.Name, w0), (WorldModelParameters.Wa.Name, wa))
            : FlrwDensities.Resolve(h0, om, ode, t, nEff, (WorldModelParameters.W0.Name, w0));
        return new DarkEnergyParameters(h0, om, d.OmegaRadiation, d.OmegaDarkEnergy, w0, wa, ode is null, d.Values);
    }
}

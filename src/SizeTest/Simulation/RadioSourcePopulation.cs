using SizeTest.Foundation.Errors;

namespace SizeTest.Simulation;

/// <summary>
/// The true population of compact radio sources (VLBI cores): linear size ℓ = ℓ_m (L/L_pivot)^β (1+z)^n
/// with log-normal scatter, the parametrisation of Gurvits, Kellermann &amp; Frey 1999 (A&amp;A 342, 378)
/// used by Cao et al. 2017 (A&amp;A 606, A15), who find ℓ_m = 11.03 ± 0.25 pc for intermediate-luminosity
/// quasars with negligible β and n. Angular size θ[mas] = ℓ[pc] · 206.265 / D_A[Mpc] (small angle:
/// 1 pc / 1 Mpc = 10⁻⁶ rad = 206.265 mas).
/// </summary>
/// <param name="LinearSizePc">ℓ_m, pc (default 11.03, Cao et al. 2017).</param>
/// <param name="LuminosityExponent">β (default 0).</param>
/// <param name="SizeEvolution">n in (1+z)^n (default 0); reported by the fitter as <c>size_evolution</c>.</param>
/// <param name="ScatterDex">Intrinsic scatter of log10 ℓ, dex (default 0.1).</param>
/// <param name="LogLuminosityMean">Mean of log10(L / W Hz⁻¹) (default 27).</param>
/// <param name="LogLuminositySd">Spread of log10 L, dex (default 0.5).</param>
/// <param name="LogLuminosityPivot">log10 of the pivot luminosity L_pivot in W/Hz (default 27).</param>
public sealed record RadioSourcePopulation(
    double LinearSizePc = 11.03,
    double LuminosityExponent = 0.0,
    double SizeEvolution = 0.0,
    double ScatterDex = 0.1,
    double LogLuminosityMean = 27.0,
    double LogLuminositySd = 0.5,
    double LogLuminosityPivot = 27.0)
{
    /// <summary>Checks the values; throws an <see cref="Foundation.Errors.InputException"/> naming the setting (<see cref="Foundation.Errors.SettingProblem"/>), or an <see cref="ArgumentException"/> for a value no setting gives, with a user-facing message.</summary>
    public void Validate()
    {
        if (!(LinearSizePc > 0) || !double.IsFinite(LinearSizePc)) throw new ArgumentException($"the linear size ℓ_m must be positive (pc); got {LinearSizePc}");
        if (!(ScatterDex >= 0) || !double.IsFinite(ScatterDex)) throw SettingProblem.Input($"{{scatter_dex}} must be ≥ 0; got {ScatterDex}");
        if (!(LogLuminositySd >= 0) || !double.IsFinite(LogLuminositySd)) throw new ArgumentException($"the log-luminosity spread must be ≥ 0; got {LogLuminositySd}");
        if (!double.IsFinite(LuminosityExponent) || !double.IsFinite(SizeEvolution) || !double.IsFinite(LogLuminosityMean) || !double.IsFinite(LogLuminosityPivot))
            throw new ArgumentException("radio-source population parameters must be finite numbers");
    }
}

using SizeTest.Foundation.Errors;

namespace SizeTest.Simulation;

/// <summary>
/// Measurement errors of a mock survey.
/// </summary>
/// <remarks>
/// <para>Sizes: log-normal, ln θ_obs = ln θ_true + σ_ln ε with σ_ln = √(f² + (floor/θ_med(z))²) (a fractional error f
/// plus an absolute floor, added in quadrature); θ_med(z) is the population's median angular size at z (pivot luminosity), so
/// the floor depends on where the object is, never on its own true size, and the quoted error is ancillary, as the likelihood
/// assumes. The catalogue's <c>theta_err</c> is σ_ln·θ_obs, so theta_err/theta = σ_ln exactly, the error of ln θ that the
/// fitter uses. Log-normal keeps every size positive.</para>
/// <para>Surface brightness: μ_obs = μ_true + σ_μ ε (mag). Photometric redshifts: z_obs = z_true + σ_z (1+z_true) ε,
/// redrawn until z_obs &gt; 0 (a truncated normal); the model quantities stay at z_true and the catalogue reports z_obs
/// with <c>z_err</c> = σ_z (1+z_obs).</para>
/// </remarks>
/// <param name="SizeErrorFraction">f, fractional size error (default 0.05).</param>
/// <param name="SizeErrorFloorArcsec">Absolute size-error floor, arcsec (default 0), taken at the population's median size at z.</param>
/// <param name="MuErrorMag">σ_μ, mag (default 0.1).</param>
/// <param name="PhotoZError">σ_z in σ_z (1+z) (default 0: spectroscopic redshifts, no z_err column).</param>
/// <param name="SizeErrors">Log-normal (default) or Gaussian-in-θ size errors. Gaussian: θ_obs = θ_true + σ_θ ε with σ_θ = f · θ_med(z),
/// θ_med the population's median angular size at z (at the pivot luminosity), quoted as theta_err; objects with θ_obs ≤ 0 fail
/// selection as unmeasured. GaussianOwnSize: the same with σ_θ = f · θ_true of each object.</param>
/// <param name="SizeErrorFractionAtZMax">When set, the fractional size error grows linearly in z from f at the N(z)'s z_min to this value at its z_max.</param>
public sealed record MeasurementErrors(
    double SizeErrorFraction = 0.05,
    double SizeErrorFloorArcsec = 0.0,
    double MuErrorMag = 0.1,
    double PhotoZError = 0.0,
    SizeErrorModel SizeErrors = SizeErrorModel.LogNormal,
    double? SizeErrorFractionAtZMax = null)
{
    /// <summary>Checks the values; throws an <see cref="Foundation.Errors.InputException"/> naming the setting (<see cref="Foundation.Errors.SettingProblem"/>).</summary>
    public void Validate()
    {
        if (!(SizeErrorFraction >= 0) || !double.IsFinite(SizeErrorFraction)) throw SettingProblem.Input($"{{size_err_frac}} must be ≥ 0; got {SizeErrorFraction}");
        if (!(SizeErrorFloorArcsec >= 0) || !double.IsFinite(SizeErrorFloorArcsec)) throw SettingProblem.Input($"{{size_err_floor}} must be ≥ 0 arcsec; got {SizeErrorFloorArcsec}");
        if (!(MuErrorMag >= 0) || !double.IsFinite(MuErrorMag)) throw SettingProblem.Input($"{{mu_err}} must be ≥ 0 mag; got {MuErrorMag}");
        if (!(PhotoZError >= 0) || !(PhotoZError < 1)) throw SettingProblem.Input($"{{photoz_err}} must be in [0, 1); got {PhotoZError}");
        if (SizeErrorFractionAtZMax is { } f1 && !(f1 >= 0 && double.IsFinite(f1))) throw SettingProblem.Input($"{{size_err_frac_zmax}} must be ≥ 0; got {f1}");
        if (SizeErrors != SizeErrorModel.LogNormal && SizeErrorFloorArcsec > 0) throw SettingProblem.Input("{size_err_floor} applies to log-normal size errors only");
    }
}

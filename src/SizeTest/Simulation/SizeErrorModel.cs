namespace SizeTest.Simulation;

/// <summary>How mock angular sizes are scattered by measurement error.</summary>
public enum SizeErrorModel
{
    /// <summary>ln θ_obs = ln θ_true + σ_ln ε (the default; every size stays positive).</summary>
    LogNormal,
    /// <summary>θ_obs = θ_true + σ_θ ε with σ_θ = f θ_med(z), f times the population's median size at z (Gaussian in θ, σ_θ independent of the object; objects with θ_obs ≤ 0 are not measured and fail selection).</summary>
    Gaussian,
    /// <summary>θ_obs = θ_true + σ_θ ε with σ_θ = f θ_true, f times the object's own true size (Gaussian in θ; the quoted theta_err
    /// is this σ_θ). Objects with θ_obs ≤ 0 are not measured and fail selection.</summary>
    GaussianOwnSize,
}

namespace SizeTest.Inference.Survey;

/// <summary>How the quoted angular-size errors enter the likelihood.</summary>
public enum SizeErrorKind
{
    /// <summary>Log-normal: σ_lnθ = σ_θ/θ (exact when the errors are log-normal; first order otherwise).</summary>
    LogNormal,
    /// <summary>Gaussian in θ with the quoted σ_θ: the log-normal intrinsic size distribution convolved exactly (adaptive Gauss–Hermite).</summary>
    Gaussian,
}

using SizeTest.Inference;

namespace SizeTest.Inference.Comparison;

/// <summary>Information criteria for a maximum log-likelihood ln L̂ with k free parameters and n data points.</summary>
public static class InformationCriteria
{
    /// <summary>AIC = 2k − 2 ln L̂ (Akaike 1974, IEEE Trans. Autom. Control 19, 716).</summary>
    public static double Aic(double logLikelihood, int k) => 2.0 * k - 2.0 * logLikelihood;

    /// <summary>
    /// AICc = AIC + 2k(k+1)/(n − k − 1) (Hurvich &amp; Tsai 1989, Biometrika 76, 297); +∞ when n ≤ k + 1
    /// (the correction is undefined: too few data for the model).
    /// </summary>
    public static double Aicc(double logLikelihood, int k, int n) =>
        n - k - 1 > 0 ? Aic(logLikelihood, k) + 2.0 * k * (k + 1) / (n - k - 1) : double.PositiveInfinity;

    /// <summary>BIC = k ln n − 2 ln L̂ (Schwarz 1978, Ann. Stat. 6, 461).</summary>
    public static double Bic(double logLikelihood, int k, int n) => k * Math.Log(n) - 2.0 * logLikelihood;
}

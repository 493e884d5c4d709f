using SizeTest.Inference;

namespace SizeTest.Inference.Comparison;

/// <summary>Information criteria for a maximum log-likelihood ln L̂ with k free parameters and n data points.</summary>
/// <remarks>
/// <b>Weighted fits.</b> With a weight column the fit maximises ln L = Σ w_i ln p_i. The weights are read as frequency weights:
/// an object of weight w stands for w identical observations, so for integer weights Σ w_i ln p_i is exactly the ordinary
/// log-likelihood of the expanded sample of N = Σ w_i observations, and Schwarz's derivation (the Laplace approximation of
/// the evidence, whose Hessian grows as N) gives the penalty k ln N with that N; Hurvich &amp; Tsai's AICc is likewise the
/// small-sample correction of that expanded sample. Non-integer weights keep the same reading (ln L and N scale together:
/// doubling every weight doubles −2 ln L̂ and adds k ln 2 to the penalty, as duplicating every row does). So the n here is
/// Σ w_i (<see cref="Evaluation.EvaluationBackend.TotalWeight"/>), the number of objects when every weight is 1; under a
/// luminosity window, the sum over the objects that model's window keeps (<see cref="Evaluation.RowSumLikelihood.InformationWeight"/>).
/// </remarks>
public static class InformationCriteria
{
    /// <summary>AIC = 2k − 2 ln L̂ (Akaike 1974, IEEE Trans. Autom. Control 19, 716).</summary>
    public static double Aic(double logLikelihood, int k) => 2.0 * k - 2.0 * logLikelihood;

    /// <summary>
    /// AICc = AIC + 2k(k+1)/(n − k − 1) (Hurvich &amp; Tsai 1989, Biometrika 76, 297); +∞ when n ≤ k + 1
    /// (the correction is undefined: too few data for the model).
    /// </summary>
    public static double Aicc(double logLikelihood, int k, double n) =>
        n - k - 1 > 0 ? Aic(logLikelihood, k) + 2.0 * k * (k + 1) / (n - k - 1) : double.PositiveInfinity;

    /// <summary>BIC = k ln n − 2 ln L̂ (Schwarz 1978, Ann. Stat. 6, 461).</summary>
    public static double Bic(double logLikelihood, int k, double n) => k * Math.Log(n) - 2.0 * logLikelihood;
}

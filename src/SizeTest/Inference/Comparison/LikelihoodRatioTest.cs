using MathNet.Numerics.Distributions;
using SizeTest.Inference;

namespace SizeTest.Inference.Comparison;

/// <summary>
/// A likelihood-ratio test of a nested pair: the model with <paramref name="Parameter"/> free against the same
/// model with it fixed at <paramref name="NullValue"/>. Λ = 2 (ln L̂_free − ln L̂_fixed) ~ χ²(Δk) under the
/// null (Wilks 1938, Ann. Math. Stat. 9, 60).
/// </summary>
/// <param name="Model">Model name.</param>
/// <param name="Parameter">The tested parameter (e.g. <c>size_evolution</c>).</param>
/// <param name="NullValue">Its value under the null (0: no evolution).</param>
/// <param name="Statistic">Λ.</param>
/// <param name="Dof">Δk.</param>
/// <param name="PValue">P(χ²_Δk ≥ Λ).</param>
/// <param name="Sigma">Two-sided Gaussian-equivalent significance of <paramref name="PValue"/>.</param>
/// <param name="Statement">One sentence for people.</param>
public sealed record LikelihoodRatioTest(string Model, string Parameter, double NullValue, double Statistic, int Dof, double PValue, double Sigma, string Statement)
{
    /// <summary>Computes the test from the two maxima (a negative Λ from rounding counts as 0).</summary>
    public static LikelihoodRatioTest Compute(string model, string parameter, double nullValue, double logLikelihoodFree, double logLikelihoodFixed, int dof, double alpha = 0.05)
    {
        if (dof < 1) throw new ArgumentOutOfRangeException(nameof(dof), "a nested pair differs by at least one parameter");
        double lambda = Math.Max(0, 2 * (logLikelihoodFree - logLikelihoodFixed));
        double p = ChiSquared.CDF(dof, lambda) is var c && c < 1 ? 1 - c : 0.0;
        if (p == 0) p = UpperTailBound(lambda, dof);
        double sigma = p >= 1 ? 0 : Normal.InvCDF(0, 1, 1 - p / 2);
        if (double.IsInfinity(sigma) || p < 1e-300) sigma = Math.Sqrt(lambda); // Λ for 1 dof is the squared z-score
        string what = parameter switch
        {
            NuisanceParameters.Names.SizeEvolution => "size evolution",
            NuisanceParameters.Names.SbEvolution => "surface-brightness evolution",
            _ => parameter,
        };
        string ps = FormatPValue(p);
        string statement = p < alpha
            ? $"{model} needs {what} at {ps} ({sigma:0.0}σ; Wilks χ² with {dof} dof)"
            : $"{model} does not need {what} ({ps}; Wilks χ² with {dof} dof)";
        return new LikelihoodRatioTest(model, parameter, nullValue, lambda, dof, p, sigma, statement);
    }

    // Tail of χ² beyond double precision of 1 − CDF: use the regularised upper incomplete gamma directly.
    private static double UpperTailBound(double lambda, int dof) =>
        MathNet.Numerics.SpecialFunctions.GammaUpperRegularized(dof / 2.0, lambda / 2.0);

    /// <summary>
    /// A p-value clause for people ("p = …"): four decimals down to 1e-4, then scientific, and "&lt; 1e-300" where the
    /// tail probability underflows double precision (so no "p = 0" is ever printed).
    /// </summary>
    public static string FormatPValue(double p)
    {
        var inv = System.Globalization.CultureInfo.InvariantCulture;
        if (p < 1e-300) return "p < 1e-300";
        return "p = " + (p < 1e-4 ? p.ToString("0.0e+0", inv) : p.ToString("0.0000", inv));
    }
}

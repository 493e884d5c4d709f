using SizeTest.Inference;

namespace SizeTest.Inference.Comparison;

/// <summary>
/// The Bayes factor of the best-ranked model over another, B = Z_best / Z_other, with its strength in the
/// words of Kass &amp; Raftery (1995, JASA 90, 773, §3.2) on the 2 ln B scale: 0–2 "not worth more than a bare
/// mention", 2–6 "positive", 6–10 "strong", above 10 "very strong".
/// </summary>
/// <param name="Favoured">Model in the numerator.</param>
/// <param name="Against">Model in the denominator.</param>
/// <param name="LnB">ln B.</param>
/// <param name="LnBError">1σ uncertainty of ln B when both evidences carry one, else null.</param>
/// <param name="BicApproximate">True when ln B ≈ −½ ΔBIC (Schwarz 1978; Kass &amp; Raftery 1995, eq. 9) because
/// no evidence was computed.</param>
/// <param name="Strength">Kass–Raftery wording.</param>
public sealed record BayesFactor(string Favoured, string Against, double LnB, double? LnBError, bool BicApproximate, string Strength)
{
    /// <summary>Kass &amp; Raftery (1995) words for a given ln B ≥ 0.</summary>
    public static string Describe(double lnB)
    {
        double twoLnB = 2 * Math.Abs(lnB);
        return twoLnB < 2 ? "not worth more than a bare mention"
            : twoLnB < 6 ? "positive"
            : twoLnB < 10 ? "strong"
            : "very strong";
    }
}

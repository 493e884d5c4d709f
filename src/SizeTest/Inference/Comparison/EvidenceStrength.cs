using SizeTest.Inference;

namespace SizeTest.Inference.Comparison;

/// <summary>
/// The strength of evidence for one model over another on the scale of Kass &amp; Raftery (1995, JASA 90, 773,
/// §3.2), read on 2 ln B, which the BIC approximates as ΔBIC (Schwarz 1978; Kass &amp; Raftery 1995, eq. 9):
/// 0–2 "not worth more than a bare mention" (<c>weak</c> here), 2–6 <c>positive</c>, 6–10 <c>strong</c>,
/// above 10 <c>very strong</c>; <c>none</c> when the two tie or the data cannot tell them apart at all.
/// </summary>
public static class EvidenceStrength
{
    /// <summary>The machine word for a 2 ln B ≥ 0 (<c>none</c> for a tie, 2 ln B below <paramref name="tie"/>).</summary>
    public static string FromTwoLnB(double twoLnB, double tie = 1e-6)
    {
        if (!double.IsFinite(twoLnB)) return double.IsPositiveInfinity(twoLnB) ? "very strong" : "none";
        double x = Math.Abs(twoLnB);
        return x < tie ? "none" : x < 2 ? "weak" : x < 6 ? "positive" : x < 10 ? "strong" : "very strong";
    }

    /// <summary>The words people read for a strength ("not worth more than a bare mention" for <c>weak</c>).</summary>
    public static string Words(string strength) => strength switch
    {
        "none" => "none (the models tie)",
        "weak" => "not worth more than a bare mention",
        _ => strength,
    };

    /// <summary>Words for ΔBIC of a model against the best one, as the summary table shows them.</summary>
    public static string AgainstBest(double deltaBic) => FromTwoLnB(deltaBic) switch
    {
        "none" => "ties with the best",
        "weak" => "not worth more than a bare mention",
        var s => $"{s} against",
    };
}

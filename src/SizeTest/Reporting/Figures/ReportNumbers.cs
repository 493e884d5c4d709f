using SizeTest.Reporting.Data;

namespace SizeTest.Reporting.Figures;

/// <summary>Numbers the report derives from what it is given (no fitting): BIC weights and evidence wording.</summary>
public static class ReportNumbers
{
    /// <summary>
    /// BIC weights w_i = exp(−ΔBIC_i/2) / Σ_j exp(−ΔBIC_j/2), the BIC analogue of Akaike weights
    /// (Burnham &amp; Anderson 2002, §6.4), computed from the models' ΔBIC.
    /// </summary>
    public static IReadOnlyList<double> BicWeights(IReadOnlyList<ModelReport> models)
    {
        if (models.Count == 0) return [];
        double min = models.Min(m => m.Fit.DeltaBic);
        var w = models.Select(m => Math.Exp(-(m.Fit.DeltaBic - min) / 2)).ToArray();
        double sum = w.Sum();
        return w.Select(v => v / sum).ToArray();
    }

    /// <summary>
    /// Words for a ΔBIC (≈ 2 ln Bayes factor) on the scale of Kass &amp; Raftery (1995, §3.2):
    /// 0–2 "not worth more than a bare mention", 2–6 "positive", 6–10 "strong", &gt; 10 "very strong".
    /// </summary>
    public static string EvidenceWords(double deltaBic) => deltaBic switch
    {
        < 2 => "not worth more than a bare mention",
        < 6 => "positive",
        < 10 => "strong",
        _ => "very strong",
    };
}

using SizeTest.Photometry;

namespace SizeTest.Inference.Likelihood;

/// <summary>
/// Isophotal sizes (joint model only): the mean ln θ is ln θ_e + ln(r_iso/R_e), with r_iso/R_e from <see cref="IsophotalSize"/> for
/// the Sérsic index and each object's isophote at the model's mean observed SB at R_e, μ_e,obs = m_μ (mu0 read as the rest-frame
/// SB at R_e; Graham &amp; Driver 2005 eq. 5). Where the model's observed central SB is fainter than the isophote the object
/// could not be in the sample and ln L is −∞. The SB scatter is not propagated into ln(r_iso/R_e).
/// </summary>
internal sealed class IsophotalCorrection(IsophotalSize size, double[] isophote)
{
    /// <summary>ln(r_iso/R_e) of object <paramref name="i"/> at mean SB <paramref name="muEff"/>, and its derivative in μ.</summary>
    public bool TryOffset(double muEff, int i, out double lnRatio, out double slope) =>
        size.TryLnRadiusRatio(muEff, isophote[i], out lnRatio, out slope);

    /// <summary>ln(r_iso/R_e) estimated from an object's own μ (model-independent; for start values).</summary>
    public bool TryOwnOffset(double mu, int i, out double lnRatio) => size.TryLnRadiusRatio(mu, isophote[i], out lnRatio);
}

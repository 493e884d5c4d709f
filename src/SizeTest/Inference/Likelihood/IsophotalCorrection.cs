using SizeTest.Photometry;

namespace SizeTest.Inference.Likelihood;

/// <summary>
/// Isophotal sizes (joint model only): the mean ln θ is ln θ_e + ln(r_iso/R_e), with r_iso/R_e from <see cref="IsophotalSize"/> for
/// each object's Sérsic index (the <c>sersic_n</c> column, or the sample-wide index) and isophote at the model's mean observed SB
/// at R_e, μ_e,obs = m_μ (mu0 read as the rest-frame SB at R_e; Graham &amp; Driver 2005 eq. 5). Where the model's observed central
/// SB is fainter than the isophote the object could not be in the sample and ln L is −∞. The SB scatter is not propagated into
/// ln(r_iso/R_e).
/// </summary>
internal sealed class IsophotalCorrection
{
    private readonly double[] _isophote;
    private readonly double[] _n;
    private readonly double[] _scale; // ln 10 / (2.5 b_n) per object, computed once at bind time

    /// <summary>One Sérsic index for every object.</summary>
    public IsophotalCorrection(IsophotalSize size, double[] isophote)
        : this(Enumerable.Repeat(size.SersicIndex, isophote.Length).ToArray(), isophote) { }

    /// <summary>A Sérsic index per object (<paramref name="sersicN"/>[i] for object i).</summary>
    public IsophotalCorrection(double[] sersicN, double[] isophote)
    {
        if (sersicN.Length != isophote.Length) throw new ArgumentException($"{sersicN.Length} Sérsic indices for {isophote.Length} isophotes");
        _isophote = isophote;
        _n = sersicN;
        _scale = new double[sersicN.Length];
        var cache = new Dictionary<double, double>();
        for (int i = 0; i < sersicN.Length; i++)
        {
            if (!cache.TryGetValue(sersicN[i], out double s)) cache[sersicN[i]] = s = IsophotalSize.Scale(sersicN[i]);
            _scale[i] = s;
        }
    }

    /// <summary>ln(r_iso/R_e) of object <paramref name="i"/> at mean SB <paramref name="muEff"/>, and its derivative in μ.</summary>
    public bool TryOffset(double muEff, int i, out double lnRatio, out double slope) =>
        IsophotalSize.TryLnRadiusRatio(_n[i], _scale[i], muEff, _isophote[i], out lnRatio, out slope);

    /// <summary>ln(r_iso/R_e) estimated from an object's own μ (model-independent; for start values).</summary>
    public bool TryOwnOffset(double mu, int i, out double lnRatio) =>
        IsophotalSize.TryLnRadiusRatio(_n[i], _scale[i], mu, _isophote[i], out lnRatio, out _);
}

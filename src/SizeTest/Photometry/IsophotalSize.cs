namespace SizeTest.Photometry;

/// <summary>
/// Observed isophotal radius of a Sérsic profile. Setting μ(r_iso) = μ_iso in
/// μ(R) = μ_e + (2.5 b_n/ln 10)[(R/R_e)^{1/n} − 1] (Graham &amp; Driver 2005, PASA 22, 118, eq. 5) gives
/// <code>r_iso / R_e = [ (μ_iso − μ_e,obs) ln 10 / (2.5 b_n) + 1 ]^n</code>
/// where μ_e,obs is the surface brightness at R_e <em>as observed</em>: rest-frame μ_e plus the
/// world model's dimming 2.5 n_dim log10(1+z), plus K-correction, extinction and evolution terms.
/// </summary>
/// <remarks>
/// The isophote is not reached (the whole profile is fainter than μ_iso) when the observed
/// central surface brightness μ_0,obs = μ_e,obs − 2.5 b_n/ln 10 ≥ μ_iso; then the Try methods
/// return false and the ratio is −∞ (the object would have no isophotal size and could not
/// be in an isophotal sample). For n = 1 with R_e = b_1 h this is the exponential-disk result
/// r_iso = h (μ_iso − μ_0)/1.0857 (Freeman 1970 disk; 1.0857 = 2.5 log10 e).
/// All methods are allocation-free; the static overload caches b_n for the last n per thread.
/// </remarks>
public sealed class IsophotalSize
{
    [ThreadStatic] private static double _cachedN;
    [ThreadStatic] private static double _cachedScale;

    private readonly double _n;
    private readonly double _scale; // ln 10 / (2.5 b_n) = 1 / (1.0857 b_n), mag⁻¹

    /// <summary>Prepares the predictor for one Sérsic index (computes b_n once).</summary>
    /// <exception cref="ArgumentOutOfRangeException">n outside the accepted range of <see cref="SersicProfile"/>.</exception>
    public IsophotalSize(double sersicN)
    {
        _n = sersicN;
        _scale = Scale(sersicN);
    }

    /// <summary>The Sérsic index n.</summary>
    public double SersicIndex => _n;

    /// <summary>
    /// ln(r_iso/R_e) for observed SB at R_e <paramref name="muEffObserved"/> and isophote
    /// <paramref name="isophote"/> (both mag/arcsec², same system). False (and −∞) when the isophote is not reached.
    /// </summary>
    public bool TryLnRadiusRatio(double muEffObserved, double isophote, out double lnRatio) =>
        TryCore(_n, _scale, muEffObserved, isophote, out lnRatio);

    /// <summary>
    /// ln(r_iso/R_e) as <see cref="TryLnRadiusRatio(double, double, out double)"/>, and its derivative with respect to the
    /// observed SB at R_e: d ln(r_iso/R_e)/dμ_e,obs = −n·s/[1 + (μ_iso − μ_e,obs)·s], s = ln 10/(2.5 b_n) (differentiating
    /// the class formula). Both −∞/0 when the isophote is not reached.
    /// </summary>
    public bool TryLnRadiusRatio(double muEffObserved, double isophote, out double lnRatio, out double slope) =>
        TryLnRadiusRatio(_n, _scale, muEffObserved, isophote, out lnRatio, out slope);

    /// <summary>s = ln 10/(2.5 b_n) in mag⁻¹ for Sérsic index <paramref name="sersicN"/>, the scale the static overloads take.</summary>
    /// <exception cref="ArgumentOutOfRangeException">n outside the accepted range of <see cref="SersicProfile"/>.</exception>
    public static double Scale(double sersicN) => 1.0 / (SersicProfile.MagnitudesPerEFold * SersicProfile.Bn(sersicN));

    /// <summary>
    /// The instance method's ln(r_iso/R_e) and its derivative in μ_e,obs for any Sérsic index <paramref name="sersicN"/> with its
    /// <paramref name="scale"/> = <see cref="Scale"/>(n) computed beforehand (one index per object without an instance each).
    /// </summary>
    public static bool TryLnRadiusRatio(double sersicN, double scale, double muEffObserved, double isophote, out double lnRatio, out double slope)
    {
        double bracket = 1.0 + (isophote - muEffObserved) * scale;
        if (bracket > 0 && !double.IsNaN(bracket))
        {
            lnRatio = sersicN * Math.Log(bracket);
            slope = -sersicN * scale / bracket;
            return true;
        }
        lnRatio = double.NegativeInfinity;
        slope = 0;
        return false;
    }

    /// <summary>
    /// Vectorised form: <paramref name="lnRatio"/>[i] = ln(r_iso/R_e) for each object, −∞ where the
    /// isophote is not reached. Returns the number of objects that reach the isophote.
    /// </summary>
    public int LnRadiusRatios(ReadOnlySpan<double> muEffObserved, ReadOnlySpan<double> isophote, Span<double> lnRatio)
    {
        if (isophote.Length != muEffObserved.Length || lnRatio.Length != muEffObserved.Length)
            throw new ArgumentException("muEffObserved, isophote and lnRatio must have the same length.");
        int ok = 0;
        for (int i = 0; i < muEffObserved.Length; i++)
            if (TryCore(_n, _scale, muEffObserved[i], isophote[i], out lnRatio[i])) ok++;
        return ok;
    }

    /// <summary>
    /// ln(r_iso/R_e) for Sérsic index <paramref name="sersicN"/>; see the class remarks. Caches b_n
    /// for the last n used on this thread, so calls with a fixed n cost one log and one division.
    /// </summary>
    public static bool TryLnRadiusRatio(double sersicN, double muEffObserved, double isophote, out double lnRatio)
    {
        if (sersicN != _cachedN || _cachedScale == 0)
        {
            _cachedScale = 1.0 / (SersicProfile.MagnitudesPerEFold * SersicProfile.Bn(sersicN));
            _cachedN = sersicN;
        }
        return TryCore(sersicN, _cachedScale, muEffObserved, isophote, out lnRatio);
    }

    /// <summary>
    /// The isophotal radius in units of R_e, r_iso/R_e, or 0 when the isophote is not reached.
    /// </summary>
    public static double RadiusRatio(double sersicN, double muEffObserved, double isophote) =>
        TryLnRadiusRatio(sersicN, muEffObserved, isophote, out var l) ? Math.Exp(l) : 0.0;

    private static bool TryCore(double n, double scale, double muEffObserved, double isophote, out double lnRatio)
    {
        double bracket = 1.0 + (isophote - muEffObserved) * scale;
        if (bracket > 0 && !double.IsNaN(bracket))
        {
            lnRatio = n * Math.Log(bracket);
            return true;
        }
        lnRatio = double.NegativeInfinity;
        return false;
    }
}

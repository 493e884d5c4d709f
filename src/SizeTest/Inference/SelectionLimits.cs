namespace SizeTest.Inference;

/// <summary>
/// Survey selection cuts that truncate the likelihood. Each present cut renormalises every
/// object's density by the probability that an object at its redshift passes the cuts under
/// the model (analytic for the Gaussian model).
/// </summary>
/// <param name="SbLimit">Objects have μ &lt; SbLimit (mag/arcsec²), or null.</param>
/// <param name="MagLimit">Objects have total magnitude m &lt; MagLimit, or null. A truncation in the joint observable:
/// m = μ − 5 log10(θ/arcsec) − 2.5 log10(2π) for the mean surface brightness within the half-light radius; with the size–luminosity
/// relation (size or joint) no truncation, since the fit conditions on the magnitudes (<see cref="NuisanceModel.MagLimitIsConditioned"/>).</param>
/// <param name="MinThetaArcsec">Objects have θ &gt; MinThetaArcsec (resolution limit), or null.</param>
public sealed record SelectionLimits(double? SbLimit = null, double? MagLimit = null, double? MinThetaArcsec = null)
{
    /// <summary>No selection cuts.</summary>
    public static SelectionLimits None { get; } = new();

    /// <summary>True when no cut is set.</summary>
    [System.Text.Json.Serialization.JsonIgnore]
    public bool IsEmpty => SbLimit is null && MagLimit is null && MinThetaArcsec is null;
}

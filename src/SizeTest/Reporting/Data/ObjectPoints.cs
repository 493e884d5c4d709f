namespace SizeTest.Reporting.Data;

/// <summary>The accepted objects as drawn: redshift, angular size in arcsec and surface brightness in mag/arcsec², with 1σ errors.</summary>
/// <param name="Z">Redshift per object.</param>
public sealed record ObjectPoints(IReadOnlyList<double> Z)
{
    /// <summary>Redshift errors, or null.</summary>
    public IReadOnlyList<double>? ZErr { get; init; }
    /// <summary>Angular size (arcsec), or null when the sample has none.</summary>
    public IReadOnlyList<double>? ThetaArcsec { get; init; }
    /// <summary>Angular-size error (arcsec), or null.</summary>
    public IReadOnlyList<double>? ThetaErrArcsec { get; init; }
    /// <summary>Surface brightness (mag/arcsec²), or null.</summary>
    public IReadOnlyList<double>? Mu { get; init; }
    /// <summary>Surface-brightness error (mag/arcsec²), or null.</summary>
    public IReadOnlyList<double>? MuErr { get; init; }
    /// <summary>
    /// The points of a validated sample: angles converted from radians to arcsec
    /// (× 648000/π, <see cref="SizeTest.Foundation.Angles.AngleUnits.ArcsecPerRadian"/>), surface brightness as is.
    /// </summary>
    public static ObjectPoints FromRows(Catalogues.CatalogueRows sample)
    {
        ArgumentNullException.ThrowIfNull(sample);
        static double[]? Arcsec(double[]? rad) => rad?.Select(r => r * SizeTest.Foundation.Angles.AngleUnits.ArcsecPerRadian).ToArray();
        return new ObjectPoints(sample.Z)
        {
            ZErr = sample.ZErr, ThetaArcsec = Arcsec(sample.ThetaRad), ThetaErrArcsec = Arcsec(sample.ThetaErrRad),
            Mu = sample.Mu, MuErr = sample.MuErr,
        };
    }

    /// <summary>Number of objects.</summary>
    [System.Text.Json.Serialization.JsonIgnore]
    public int Count => Z.Count;
}

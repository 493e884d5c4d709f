namespace SizeTest.Cosmology;

/// <summary>
/// Tolman surface-brightness dimming: the bolometric surface brightness of a given object
/// falls as (1+z)^−n, i.e. by Δμ = 2.5 n log10(1+z) mag arcsec⁻² (Tolman 1930, PNAS 16, 511;
/// n = 4 for every FLRW model, n = 1 for a static model with energy loss only).
/// </summary>
public static class TolmanDimming
{
    /// <summary>Dimming in magnitudes, 2.5 n log10(1+z); e.g. 10 log10(1+z) for n = 4.</summary>
    /// <param name="exponent">Dimming exponent n.</param>
    /// <param name="z">Redshift, finite and ≥ 0.</param>
    public static double Magnitudes(double exponent, double z)
    {
        if (!(z >= 0.0) || double.IsPositiveInfinity(z))
            throw new ArgumentOutOfRangeException(nameof(z), z, $"Redshift must be finite and ≥ 0; got {z}.");
        return 2.5 * exponent * Math.Log10(1.0 + z);
    }

    /// <summary>Surface-brightness ratio SB(z)/SB(0) = (1+z)^−n.</summary>
    public static double Factor(double exponent, double z) => Math.Pow(10.0, -0.4 * Magnitudes(exponent, z));
}

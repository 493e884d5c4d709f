namespace SizeTest.Catalogs;

/// <summary>How the catalogue's angular size was measured. Travels with the sample.</summary>
public enum SizeKind
{
    /// <summary>Half-light (effective) radius R_e.</summary>
    EffectiveRadius,
    /// <summary>Petrosian radius.</summary>
    Petrosian,
    /// <summary>Radius at a fixed observed isophote (see <see cref="SizeDefinition.IsophoteMagPerArcsec2"/>).</summary>
    Isophotal,
    /// <summary>Gaussian full width at half maximum (compact radio sources).</summary>
    GaussianFwhm,
}

/// <summary>The size definition of a sample.</summary>
/// <param name="Kind">Which size.</param>
/// <param name="IsophoteMagPerArcsec2">The isophote level for <see cref="SizeKind.Isophotal"/>, mag/arcsec²; otherwise null.</param>
public sealed record SizeDefinition(SizeKind Kind, double? IsophoteMagPerArcsec2 = null)
{
    /// <summary>The default: effective (half-light) radius.</summary>
    public static SizeDefinition Effective { get; } = new(SizeKind.EffectiveRadius);
}

namespace SizeTest.Foundation.Angles;

/// <summary>Exact unit definitions used across stages.</summary>
public static class AngleUnits
{
    /// <summary>Radians per arcsecond, π/648000 exactly (definition of the arcsecond: 1° = 3600″, 180° = π rad).</summary>
    public const double RadiansPerArcsec = Math.PI / 648000.0;

    /// <summary>Arcseconds per radian, 648000/π ≈ 206264.806.</summary>
    public const double ArcsecPerRadian = 648000.0 / Math.PI;

    /// <summary>Radians per milliarcsecond.</summary>
    public const double RadiansPerMilliarcsec = RadiansPerArcsec / 1000.0;
}

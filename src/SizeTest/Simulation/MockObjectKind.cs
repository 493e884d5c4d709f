namespace SizeTest.Simulation;

/// <summary>The kind of object a mock survey draws.</summary>
public enum MockObjectKind
{
    /// <summary>Galaxies: effective (half-light) radius and mean surface brightness within it.</summary>
    Galaxy,
    /// <summary>Compact radio sources: a VLBI core linear size ℓ = ℓ_m L^β (1+z)^n (Gurvits, Kellermann &amp; Frey 1999).</summary>
    CompactRadio,
}

namespace SizeTest.Inference.Survey;

/// <summary>What the size of a standard rod depends on besides redshift.</summary>
public enum SizeRelationKind
{
    /// <summary>Redshift only: R = R0 (1+z)^a.</summary>
    None,
    /// <summary>Luminosity: R = R0 (L/L_pivot)^β (1+z)^a (radio: ℓ = ℓ_m L^β (1+z)^n).</summary>
    Luminosity,
    /// <summary>Stellar mass: R = R0 (M/M_pivot)^β (1+z)^a.</summary>
    Mass,
}

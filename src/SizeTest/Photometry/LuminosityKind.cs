namespace SizeTest.Photometry;

/// <summary>Where an object's luminosity (or mass) comes from.</summary>
public enum LuminosityKind
{
    /// <summary>Apparent magnitude m (AB, zero-pointed): M = m − 5 log10(D_L/10 pc) − K − A with each model's D_L.</summary>
    ApparentMagnitude,
    /// <summary>Absolute magnitude in a reference cosmology: M = M_ref − 5 log10(D_L/D_L,ref).</summary>
    AbsoluteMagnitude,
    /// <summary>log10 stellar mass in a reference cosmology: log M = log M_ref + 2 log10(D_L/D_L,ref).</summary>
    StellarMass,
    /// <summary>Radio flux density S_ν: L_ν = 4π D_L² S_ν (1+z)^−(1+α), S_ν ∝ ν^α.</summary>
    FluxDensity,
}

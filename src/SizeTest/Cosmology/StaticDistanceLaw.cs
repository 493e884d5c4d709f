namespace SizeTest.Cosmology;

/// <summary>How distance grows with redshift in a static Euclidean world model.</summary>
public enum StaticDistanceLaw
{
    /// <summary>A linear Hubble law at all z: d = cz/H0 (family <c>static-linear</c>).</summary>
    Linear,

    /// <summary>Exponential energy loss of light, dE/dr = −E H0/c: d = (c/H0) ln(1+z) (family <c>tired-light</c>).</summary>
    Logarithmic,
}

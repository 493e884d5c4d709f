namespace SizeTest.Photometry;

/// <summary>
/// The pivot of a size–luminosity (or size–mass) relation R = R0 (L/L_pivot)^β (1+z)^a: R0 is the size at the pivot.
/// </summary>
/// <param name="AbsMag">Pivot absolute magnitude M_pivot (default −21, near M* of local galaxies; common practice).</param>
/// <param name="LogMass">Pivot log10(M/M_⊙) (default 10.7, the 5·10¹⁰ M_⊙ normalisation of van der Wel et al. 2014, eq. 2).</param>
/// <param name="LogRadioLuminosity">Pivot log10(L_ν / W Hz⁻¹) for radio sources (default 27, the simulator's default).</param>
public sealed record LuminosityPivot(double AbsMag = -21.0, double LogMass = 10.7, double LogRadioLuminosity = 27.0)
{
    /// <summary>The defaults.</summary>
    public static LuminosityPivot Default { get; } = new();
}

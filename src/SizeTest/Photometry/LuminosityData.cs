namespace SizeTest.Photometry;

/// <summary>
/// What each object contributes to a per-model luminosity (or mass): the measured quantity, the corrections
/// and, for quantities a catalogue computed in a reference cosmology, that cosmology's luminosity distance at
/// each object's redshift. <see cref="ModelLuminosity"/> turns it into ln L for any world model.
/// </summary>
/// <param name="Kind">Which quantity <paramref name="Values"/> holds.</param>
/// <param name="Values">m (mag, AB), M_ref (mag), log10(M/M_⊙) or S_ν (Jy), per object.</param>
/// <param name="Correction">Per object K + A (mag) for <see cref="LuminosityKind.ApparentMagnitude"/>; null = 0.</param>
/// <param name="LnReferenceDistance">ln D_L,ref(z_i) in Mpc for the reference-cosmology kinds; null otherwise.</param>
/// <param name="ReferenceModel">Name of the reference cosmology (for notes), or null.</param>
/// <param name="SpectralIndex">Radio spectral index α in S_ν ∝ ν^α (default 0: flat-spectrum cores).</param>
/// <param name="FrequencyGhz">Observing frequency of <see cref="LuminosityKind.FluxDensity"/> in GHz (L_ν refers to the rest frequency ν(1+z) unless α corrects it to ν), or null.</param>
public sealed record LuminosityData(
    LuminosityKind Kind,
    double[] Values,
    double[]? Correction = null,
    double[]? LnReferenceDistance = null,
    string? ReferenceModel = null,
    double SpectralIndex = 0.0,
    double? FrequencyGhz = null)
{
    /// <summary>The rows <paramref name="idx"/> (repeats allowed).</summary>
    public LuminosityData Take(int[] idx)
    {
        double[]? Pick(double[]? a) => a is null ? null : Array.ConvertAll(idx, i => a[i]);
        return this with { Values = Pick(Values)!, Correction = Pick(Correction), LnReferenceDistance = Pick(LnReferenceDistance) };
    }

    /// <summary>True for a mass (size–mass relation) rather than a luminosity.</summary>
    public bool IsMass => Kind == LuminosityKind.StellarMass;
}

using SizeTest.Cosmology;

namespace SizeTest.Photometry;

/// <summary>
/// How <see cref="ObservablesBuilder"/> prepares per-model luminosities (<see cref="LuminosityData"/>).
/// </summary>
/// <param name="Mass">True: use stellar masses (<c>log_mass</c>) for a size–mass relation; false: luminosities.</param>
/// <param name="Reference">The cosmology in which the catalogue computed <c>abs_mag</c> or <c>log_mass</c> (null: flat ΛCDM,
/// H0 = 70, Ωm = 0.3, the most common catalogue choice; stated in the notes).</param>
/// <param name="SpectralIndex">Radio spectral index α, S_ν ∝ ν^α (default 0: flat-spectrum compact cores).</param>
/// <param name="FrequencyGhz">Observing frequency of the flux densities in GHz (recorded in the notes), or null.</param>
/// <remarks>Source order for luminosities: <c>flux_density</c>, then the apparent magnitude <c>mag</c> (computed per model
/// with its K-correction and extinction), then <c>abs_mag</c> (converted by (D_L/D_L,ref)²).</remarks>
public sealed record LuminosityOption(bool Mass = false, IWorldModel? Reference = null, double SpectralIndex = 0.0, double? FrequencyGhz = null)
{
    /// <summary>The reference cosmology actually used.</summary>
    public IWorldModel ReferenceModel => Reference ?? new LambdaCdmModel(70, 0.3);
}

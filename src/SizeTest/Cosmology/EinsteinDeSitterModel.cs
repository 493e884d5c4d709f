namespace SizeTest.Cosmology;

/// <summary>
/// Einstein–de Sitter: flat, matter only (Ωm = 1), E(z) = (1+z)^{3/2}. Closed forms
/// (integrating 1/E): D_C = 2 D_H [1 − (1+z)^{−1/2}]; t_L = (2/3) t_H [1 − (1+z)^{−3/2}];
/// age (2/3) t_H. D_A peaks at z = 5/4 with D_A,max = (8/27) D_H.
/// </summary>
public sealed class EinsteinDeSitterModel : FlrwModel
{
    /// <summary>Builds the model.</summary>
    /// <param name="hubbleConstant">H0 in km/s/Mpc.</param>
    public EinsteinDeSitterModel(double hubbleConstant = 70)
        : base("eds", hubbleConstant, 1.0, 0.0, 0.0, new Dictionary<string, double> { [WorldModelParameters.H0.Name] = hubbleConstant }, 0.0)
    {
    }

    /// <inheritdoc/>
    protected override bool HasClosedForm => true;

    /// <inheritdoc/>
    public override double InverseHubbleFunction(double z) => Math.Pow(1.0 + z, -1.5);

    /// <inheritdoc/>
    protected override double ComovingIntegral(double z) => 2.0 * (1.0 - 1.0 / Math.Sqrt(1.0 + z));

    /// <inheritdoc/>
    protected override double LookbackIntegral(double z) => 2.0 / 3.0 * (1.0 - Math.Pow(1.0 + z, -1.5));

    /// <summary>Age (2/3) t_H.</summary>
    public override double AgeGyr => 2.0 / 3.0 * HubbleTime;
}

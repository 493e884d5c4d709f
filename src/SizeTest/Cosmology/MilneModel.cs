namespace SizeTest.Cosmology;

/// <summary>
/// Milne (empty, open) universe: Ωm = ΩΛ = 0, Ωk = 1, E(z) = 1+z. Closed forms:
/// D_C = D_H ln(1+z); D_M = D_H sinh(ln(1+z)) = D_H z(1 + z/2)/(1+z);
/// D_L = D_H z(1 + z/2); t_L = t_H z/(1+z); age t_H. D_A rises monotonically to D_H/2.
/// </summary>
public sealed class MilneModel : FlrwModel
{
    /// <summary>Builds the model.</summary>
    /// <param name="hubbleConstant">H0 in km/s/Mpc.</param>
    public MilneModel(double hubbleConstant = 70)
        : base("milne", hubbleConstant, 0.0, 0.0, 0.0, new Dictionary<string, double> { [WorldModelParameters.H0.Name] = hubbleConstant }, 1.0)
    {
    }

    /// <inheritdoc/>
    protected override bool HasClosedForm => true;

    /// <inheritdoc/>
    public override double InverseHubbleFunction(double z) => 1.0 / (1.0 + z);

    /// <inheritdoc/>
    protected override double ComovingIntegral(double z) => Log1P(z);

    /// <inheritdoc/>
    protected override double LookbackIntegral(double z) => z / (1.0 + z);

    /// <summary>Age t_H.</summary>
    public override double AgeGyr => HubbleTime;
}

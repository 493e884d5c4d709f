using SizeTest.Inference;
using SizeTest.Inference.Comparison;

namespace SizeTest.Reporting.Tables;

/// <summary>
/// The linear size scale of compact radio sources as people read it: the fit's <c>r0_kpc</c> is ℓ_m in
/// ℓ = ℓ_m (L/L_pivot)^β (1+z)^n (Gurvits, Kellermann &amp; Frey 1999), whose values are parsecs (ℓ_m ≈ 11 pc, Cao et al. 2017),
/// so the report prints it ×1000 in pc. 1 kpc = 1000 pc by definition.
/// </summary>
public static class RadioLinearSize
{
    /// <summary>pc per kpc.</summary>
    public const double PcPerKpc = 1000;

    /// <summary>Whether <paramref name="name"/> is a size scale (r0_kpc, r0_kpc@GROUP or r0_kpc_binK).</summary>
    public static bool IsSizeScale(string name) =>
        EvolutionTestTable.BaseName(name).StartsWith(NuisanceParameters.Names.R0Kpc, StringComparison.Ordinal);

    /// <summary>
    /// <paramref name="p"/> in pc, named "ℓ_m (r0_kpc)" (with its group or bin suffix), when it is a size scale; otherwise unchanged.
    /// </summary>
    public static ParameterEstimate InPc(ParameterEstimate p)
    {
        ArgumentNullException.ThrowIfNull(p);
        if (!IsSizeScale(p.Name)) return p;
        return p with { Name = "ℓ_m (" + p.Name + ")", Value = p.Value * PcPerKpc, Lo = p.Lo * PcPerKpc, Hi = p.Hi * PcPerKpc, Unit = "pc" };
    }
}

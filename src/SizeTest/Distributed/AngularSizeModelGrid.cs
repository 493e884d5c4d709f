using SizeTest.Cosmology;

namespace SizeTest.Distributed;

/// <summary>
/// The angular-size model on the redshift grid, computed once per parameter vector:
/// ln θ_model(z_k) = ln R0 + a ln(1+z_k) − ln D_A(z_k), θ in radians, R0 and D_A in kpc
/// (small-angle θ = ℓ/D_A with size evolution ℓ = R0 (1+z)^a; docs/science.md §1.7, common practice).
/// </summary>
public static class AngularSizeModelGrid
{
    /// <summary>
    /// Fills <paramref name="lnThetaModel"/> (length grid.Count) for world model <paramref name="model"/>,
    /// ln of the size at z = 0 in kpc <paramref name="lnR0Kpc"/> and size-evolution exponent <paramref name="sizeEvolution"/>.
    /// Uses the model's batched distance call, so one evaluation costs grid.Count distances, not one per object.
    /// </summary>
    public static void Fill(IWorldModel model, LogRedshiftGrid grid, double lnR0Kpc, double sizeEvolution, Span<double> lnThetaModel)
    {
        ArgumentNullException.ThrowIfNull(model);
        ArgumentNullException.ThrowIfNull(grid);
        if (lnThetaModel.Length != grid.Count) throw new ArgumentException("The grid buffer must have one entry per node.", nameof(lnThetaModel));
        model.AngularDiameterDistances(grid.Nodes, lnThetaModel);
        FillFromDistances(grid, lnThetaModel, lnR0Kpc, sizeEvolution, lnThetaModel);
    }

    /// <summary>
    /// As <see cref="Fill"/> but from D_A at the nodes in Mpc (<paramref name="distanceMpc"/>, may alias the output).
    /// </summary>
    public static void FillFromDistances(LogRedshiftGrid grid, ReadOnlySpan<double> distanceMpc, double lnR0Kpc, double sizeEvolution, Span<double> lnThetaModel)
    {
        ArgumentNullException.ThrowIfNull(grid);
        if (distanceMpc.Length != grid.Count || lnThetaModel.Length != grid.Count) throw new ArgumentException("Grid buffers must have one entry per node.");
        var nodes = grid.Nodes;
        for (int k = 0; k < nodes.Length; k++)
            lnThetaModel[k] = lnR0Kpc + sizeEvolution * Math.Log(1 + nodes[k]) - Math.Log(distanceMpc[k] * 1000.0);
    }
}

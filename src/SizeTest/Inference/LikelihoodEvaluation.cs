namespace SizeTest.Inference;

/// <summary>
/// The per-evaluation state of an <see cref="ISlicedLogLikelihood"/>: the parameter values and everything that depends
/// only on them and on redshift (the world model's ln D_A on the redshift grid, the dimming exponent, and — when prepared
/// with gradients — their derivatives with respect to the free cosmological parameters). Immutable once built, so one
/// instance serves every thread or rank slice of one evaluation.
/// </summary>
public sealed class LikelihoodEvaluation
{
    internal LikelihoodEvaluation(double[] theta, double[] values, double[]? gridLnDaOverZ, double dimming)
    {
        Theta = theta;
        Values = values;
        GridLnDaOverZ = gridLnDaOverZ;
        Dimming = dimming;
    }

    /// <summary>The free-parameter vector θ this state was prepared for.</summary>
    public double[] Theta { get; }

    /// <summary>All parameter values (fixed and free), in <see cref="Hypothesis.Parameters"/> order.</summary>
    public double[] Values { get; }

    /// <summary>Whether the gradient terms were prepared (see <see cref="ISlicedLogLikelihood.Prepare(ReadOnlySpan{double}, bool)"/>).</summary>
    public bool HasGradient { get; internal init; }

    // g_k = ln D_A(z_k) − ln z_k at the grid nodes (null when cosmology is fixed: exact per-object ln D_A is used).
    internal double[]? GridLnDaOverZ { get; }

    // ∂g_k/∂θ_c for each free cosmological parameter c (row c, node k), or null.
    internal double[][]? GridLnDaOverZDerivatives { get; init; }

    // The bolometric dimming exponent n (plus the flux-convention offset) and ∂n/∂θ_c.
    internal double Dimming { get; }

    internal double[]? DimmingDerivatives { get; init; }
}

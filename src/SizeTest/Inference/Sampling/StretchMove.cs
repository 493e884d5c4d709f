namespace SizeTest.Inference.Sampling;

/// <summary>
/// The affine-invariant stretch move of Goodman &amp; Weare (2010, CAMCoS 5, 65, eqs. 7–11):
/// for walker X_k pick X_j uniformly from the complementary ensemble, draw z from
/// g(z) ∝ 1/√z on [1/a, a], propose Y = X_j + z (X_k − X_j) and accept with probability
/// min(1, z^(d−1) p(Y)/p(X_k)).
/// </summary>
public sealed class StretchMove : IEnsembleMove
{
    /// <summary>Creates the move with stretch scale <paramref name="scale"/> (a &gt; 1; Goodman &amp; Weare recommend a = 2).</summary>
    /// <exception cref="ArgumentOutOfRangeException">When a ≤ 1 or not finite.</exception>
    public StretchMove(double scale = 2.0)
    {
        if (!(scale > 1.0) || double.IsInfinity(scale))
            throw new ArgumentOutOfRangeException(nameof(scale), scale, "The stretch scale a must be a finite number greater than 1 (2 is the usual choice).");
        Scale = scale;
    }

    /// <summary>The stretch scale a.</summary>
    public double Scale { get; }

    /// <inheritdoc/>
    public string Name => "stretch";

    /// <inheritdoc/>
    public void Propose(ReadOnlySpan<double> positions, int dimension, ReadOnlySpan<int> active, ReadOnlySpan<int> complement,
                        Random rng, Span<double> proposals, Span<double> logFactors)
    {
        double a = Scale;
        for (int i = 0; i < active.Length; i++)
        {
            int k = active[i];
            int j = complement[rng.Next(complement.Length)];
            // Inverse CDF of g(z) ∝ z^(−1/2) on [1/a, a]: z = ((a − 1) u + 1)² / a.
            double t = (a - 1.0) * rng.NextDouble() + 1.0;
            double z = t * t / a;
            var xk = positions.Slice(k * dimension, dimension);
            var xj = positions.Slice(j * dimension, dimension);
            var y = proposals.Slice(i * dimension, dimension);
            for (int p = 0; p < dimension; p++)
                y[p] = xj[p] + z * (xk[p] - xj[p]);
            logFactors[i] = (dimension - 1) * Math.Log(z);
        }
    }
}

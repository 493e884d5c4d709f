namespace SizeTest.Inference.Sampling;

/// <summary>
/// Differential-evolution move (ter Braak 2006, Stat. Comput. 16, 239; used within an
/// ensemble as in Nelson, Ford &amp; Payne 2014, ApJS 210, 11): Y = X_k + γ (X_i − X_j), with
/// X_i ≠ X_j drawn from the complementary ensemble, γ = 2.38/√(2d) by default, multiplied by
/// (1 + ε) with ε ~ N(0, <see cref="Jitter"/>²) so that the step lengths are not all equal. The proposal is symmetric
/// (log factor 0). Useful mixed with the stretch move for elongated posteriors.
/// </summary>
public sealed class DifferentialEvolutionMove : IEnsembleMove
{
    /// <summary>Creates the move.</summary>
    /// <param name="gamma">Step factor γ; null for 2.38/√(2d) (ter Braak 2006).</param>
    /// <param name="jitter">Standard deviation of the multiplicative jitter on γ (default 1e-5).</param>
    public DifferentialEvolutionMove(double? gamma = null, double jitter = 1e-5)
    {
        if (gamma is { } g && !(g > 0 && double.IsFinite(g)))
            throw new ArgumentOutOfRangeException(nameof(gamma), g, "The differential-evolution step factor must be positive and finite.");
        if (!(jitter >= 0 && double.IsFinite(jitter)))
            throw new ArgumentOutOfRangeException(nameof(jitter), jitter, "The jitter must be non-negative and finite.");
        Gamma = gamma;
        Jitter = jitter;
    }

    /// <summary>Step factor γ, or null for 2.38/√(2d).</summary>
    public double? Gamma { get; }

    /// <summary>Standard deviation of the jitter applied to γ.</summary>
    public double Jitter { get; }

    /// <inheritdoc/>
    public string Name => "differential-evolution";

    /// <inheritdoc/>
    public void Propose(ReadOnlySpan<double> positions, int dimension, ReadOnlySpan<int> active, ReadOnlySpan<int> complement,
                        Random rng, Span<double> proposals, Span<double> logFactors)
    {
        if (complement.Length < 2)
            throw new InvalidOperationException("The differential-evolution move needs at least two walkers in each half of the ensemble.");
        double g0 = Gamma ?? 2.38 / Math.Sqrt(2.0 * dimension);
        for (int n = 0; n < active.Length; n++)
        {
            int k = active[n];
            int a = rng.Next(complement.Length);
            int b = rng.Next(complement.Length - 1);
            if (b >= a) b++;
            int i = complement[a], j = complement[b];
            double g = g0 * (1.0 + Jitter * StandardNormal(rng));
            for (int p = 0; p < dimension; p++)
                proposals[n * dimension + p] = positions[k * dimension + p] + g * (positions[i * dimension + p] - positions[j * dimension + p]);
            logFactors[n] = 0.0;
        }
    }

    private static double StandardNormal(Random rng)
    {
        // Box–Muller; one value per call is enough here.
        double u1 = 1.0 - rng.NextDouble();
        double u2 = rng.NextDouble();
        return Math.Sqrt(-2.0 * Math.Log(u1)) * Math.Cos(2.0 * Math.PI * u2);
    }
}

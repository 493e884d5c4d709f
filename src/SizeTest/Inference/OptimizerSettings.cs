namespace SizeTest.Inference;

/// <summary>Settings of the bounded multi-start maximum-likelihood search.</summary>
/// <param name="Starts">Number of starting points (the first is the data-driven start, the rest are seeded random
/// perturbations of it in the unbounded coordinates).</param>
/// <param name="Seed">Seed of the random starts.</param>
/// <param name="Tolerance">Each L-BFGS-B run stops when the quasi-Newton decrement −gᵀd of the projected gradient (≈ twice the
/// predicted remaining gain in ln p) is below max(Tolerance, 1e-15·|ln p|).</param>
/// <param name="MaxIterations">Iteration cap of each run.</param>
/// <param name="AgreementTolerance">Two starts agree when their maxima differ by less than this in ln L.</param>
/// <param name="InitialStep">Kept for callers; unused by the gradient-based search (the starts' spread is fixed: unit
/// Gaussian perturbations in the logistic coordinates of the box).</param>
public sealed record OptimizerSettings(int Starts = 4, int Seed = 1, double Tolerance = 1e-10, int MaxIterations = 5000, double AgreementTolerance = 0.01, double InitialStep = 0.5)
{
    /// <summary>Defaults.</summary>
    public static OptimizerSettings Default { get; } = new();
}

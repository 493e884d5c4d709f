namespace SizeTest.Inference.Sampling;

/// <summary>A Laplace evidence estimate.</summary>
/// <param name="LogEvidence">ln Z.</param>
/// <param name="LogLikelihoodAtMode">ln L(θ̂).</param>
/// <param name="LogPriorAtMode">ln π(θ̂).</param>
/// <param name="Covariance">Posterior covariance used.</param>
/// <param name="LogDeterminant">ln |Σ|.</param>
/// <param name="Warnings">Reasons to distrust the approximation (mode near a prior bound); empty when none.</param>
public sealed record LaplaceResult(double LogEvidence, double LogLikelihoodAtMode, double LogPriorAtMode, double[,] Covariance,
                                   double LogDeterminant, IReadOnlyList<string> Warnings);

namespace SizeTest.Inference.Sampling;

/// <summary>Progress of a nested-sampling run.</summary>
/// <param name="Iteration">Dead points so far.</param>
/// <param name="LogEvidence">Current ln Z (dead points only).</param>
/// <param name="RemainingLogEvidence">ln(Z + L_max X) − ln Z: how much ln Z could still change; the run stops below the tolerance.</param>
/// <param name="Tolerance">The stopping tolerance.</param>
/// <param name="LogLikelihoodThreshold">Current likelihood contour ln L*.</param>
/// <param name="Evaluations">Likelihood evaluations so far.</param>
/// <param name="Elapsed">Wall time since the start.</param>
public sealed record NestedProgress(int Iteration, double LogEvidence, double RemainingLogEvidence, double Tolerance,
                                    double LogLikelihoodThreshold, long Evaluations, TimeSpan Elapsed);

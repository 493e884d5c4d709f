namespace SizeTest.Inference.Sampling;

/// <summary>One posterior sample of a nested-sampling run with its normalised weight.</summary>
/// <param name="Theta">Parameter vector.</param>
/// <param name="LogLikelihood">ln L(θ).</param>
/// <param name="LogWeight">ln of the posterior weight p_i = w_i L_i / Z; Σ exp(LogWeight) = 1.</param>
public sealed record WeightedDraw(double[] Theta, double LogLikelihood, double LogWeight);

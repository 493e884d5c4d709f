namespace SizeTest.Inference;

/// <summary>
/// One distinct maximum of a model's likelihood (results.json: an entry of the model's <c>modes</c>), reported when the
/// fit is multimodal: its free-parameter values and ln L.
/// </summary>
/// <param name="Parameters">Free-parameter values at this maximum, by name, in the hypothesis's order.</param>
/// <param name="LogLikelihood">ln L at this maximum.</param>
public sealed record FitMode(IReadOnlyDictionary<string, double> Parameters, double LogLikelihood);

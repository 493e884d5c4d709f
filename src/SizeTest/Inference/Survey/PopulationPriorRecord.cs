namespace SizeTest.Inference.Survey;

/// <summary>
/// The population redshift prior a photo-z fit used (<see cref="PopulationRedshiftPrior"/>), as results.json's
/// <c>settings.survey.redshift_population</c> records it: π(z) ∝ Σ_k p_k N(z; c_k, s²) on the prior range, and how its EM iteration ended.
/// </summary>
/// <param name="Min">The prior range's lower end (the stated one, or the sample's lowest z).</param>
/// <param name="Max">Its upper end.</param>
/// <param name="Centres">Component centres c_k.</param>
/// <param name="Weights">Component weights p_k (Σ p_k = 1).</param>
/// <param name="Width">Component width s.</param>
/// <param name="EmSteps">EM steps taken (evaluations of the EM map, SQUAREM's included).</param>
/// <param name="Converged">Whether the last EM step changed no weight by more than <see cref="PopulationRedshiftPrior.Tolerance"/>; false:
/// the step cap stopped it, and the weights are the last iterate.</param>
/// <param name="FinalChange">The largest weight change of the last EM step.</param>
public sealed record PopulationPriorRecord(double Min, double Max, IReadOnlyList<double> Centres, IReadOnlyList<double> Weights, double Width,
    int EmSteps, bool Converged, double FinalChange)
{
    /// <summary>The record of <paramref name="prior"/>.</summary>
    public static PopulationPriorRecord From(PopulationRedshiftPrior prior)
    {
        ArgumentNullException.ThrowIfNull(prior);
        return new PopulationPriorRecord(prior.Min, prior.Max, [.. prior.Centres], [.. prior.Weights], prior.Width, prior.Iterations, prior.Converged, prior.FinalChange);
    }
}

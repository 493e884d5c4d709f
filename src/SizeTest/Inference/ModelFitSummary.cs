using SizeTest.Inference.Comparison;

namespace SizeTest.Inference;

/// <summary>
/// The reported outcome of fitting one hypothesis (world model + nuisance model) to a sample:
/// the <c>models[]</c> entry of <c>results.json</c> (schema in docs/results-schema.md).
/// Comparison fields (ΔBIC, weights) are filled in by the model comparison.
/// </summary>
public sealed record ModelFitSummary
{
    /// <summary>World-model name (e.g. <c>lcdm</c>).</summary>
    public required string Name { get; init; }
    /// <summary>Every parameter, free and fixed.</summary>
    public required IReadOnlyList<ParameterEstimate> Parameters { get; init; }
    /// <summary>
    /// A static world model's flux convention, D_L = d (1+z)^q (<see cref="Cosmology.FluxConventions.Label"/>):
    /// <c>energy-loss</c> (q = 1/2), <c>time-dilation</c> (q = 1), <c>other</c> (luminosity_exponent fixed at another
    /// value) or <c>fitted</c> (luminosity_exponent free); null for an FLRW model (D_L = (1+z)² D_A).
    /// </summary>
    public string? FluxConvention { get; init; }
    /// <summary>Maximum log-likelihood ln L̂.</summary>
    public required double LogLikelihood { get; init; }
    /// <summary>Number of free parameters k.</summary>
    public required int K { get; init; }
    /// <summary>Number of data points n.</summary>
    public required int N { get; init; }
    /// <summary>AIC = 2k − 2 ln L̂ (Akaike 1974).</summary>
    public required double Aic { get; init; }
    /// <summary>AICc = AIC + 2k(k+1)/(n−k−1) (Hurvich &amp; Tsai 1989).</summary>
    public required double Aicc { get; init; }
    /// <summary>BIC = k ln n − 2 ln L̂ (Schwarz 1978).</summary>
    public required double Bic { get; init; }
    /// <summary>BIC minus the smallest BIC among the compared models.</summary>
    public double DeltaBic { get; init; }
    /// <summary>AIC minus the smallest AIC among the compared models.</summary>
    public double DeltaAic { get; init; }
    /// <summary>Akaike weight exp(−ΔAIC/2) / Σ exp(−ΔAIC_j/2).</summary>
    public double AkaikeWeight { get; init; }
    /// <summary>ln evidence, when computed (nested sampling or Laplace), else null.</summary>
    public double? LogEvidence { get; init; }
    /// <summary>1σ uncertainty of <see cref="LogEvidence"/>, when known.</summary>
    public double? LogEvidenceError { get; init; }
    /// <summary>Whether the fit converged (optimiser and, if run, sampler diagnostics).</summary>
    public required bool Converged { get; init; }
    /// <summary>Why the fit stopped or failed (written to results.json as its sentence).</summary>
    public ExitReason ExitReason { get; init; } = ExitReason.None;
    /// <summary>Rank by BIC (1 = best). Models whose criteria agree within <see cref="ModelComparison.TieTolerance"/>
    /// share a rank (0 before ranking).</summary>
    public int Rank { get; init; }
    /// <summary>True when another model shares this model's rank (a tie: no order between them).</summary>
    public bool Tied { get; init; }
    /// <summary>The distinct maxima of the likelihood within Δ ln L &lt; 2 of the best, best first, when the fit is
    /// multimodal; empty otherwise (see <see cref="ModeSearch"/>).</summary>
    public IReadOnlyList<FitMode> Modes { get; init; } = [];
}

namespace SizeTest.Inference.Sampling;

/// <summary>Diagnostics of one parameter's chain.</summary>
/// <param name="Name">Parameter name.</param>
/// <param name="Mean">Posterior mean of the kept samples.</param>
/// <param name="StandardDeviation">Posterior standard deviation of the kept samples.</param>
/// <param name="Tau">Walker-averaged integrated autocorrelation time (steps).</param>
/// <param name="TauWindowReached">Whether Sokal's window condition was met.</param>
/// <param name="EssFromTau">walkers × steps / τ.</param>
/// <param name="SplitRhat">Rank-normalised split-R̂ (Vehtari et al. 2021) over groups of walkers (<see cref="ConvergenceCriteria.RhatGroups"/>).</param>
/// <param name="BulkEss">Bulk ESS (Vehtari et al. 2021).</param>
/// <param name="TailEss">Tail ESS (Vehtari et al. 2021).</param>
public sealed record ParameterDiagnostics(string Name, double Mean, double StandardDeviation, double Tau, bool TauWindowReached,
                                          double EssFromTau, double SplitRhat, double BulkEss, double TailEss)
{
    /// <summary>The smallest of the three ESS figures (NaN if any is NaN).</summary>
    public double MinEss => double.IsNaN(EssFromTau) || double.IsNaN(BulkEss) || double.IsNaN(TailEss)
        ? double.NaN : Math.Min(EssFromTau, Math.Min(BulkEss, TailEss));
}

namespace SizeTest.Simulation;

/// <summary>One mock's outcome: the fit of every candidate and how decisively the true model won.</summary>
/// <param name="SampleSize">N of the mock.</param>
/// <param name="Mock">Mock index k (0-based; the same k gives the same seed at every N, so smaller mocks are prefixes of larger ones).</param>
/// <param name="Seed">The mock's seed.</param>
/// <param name="Winner">Candidate with the lowest BIC.</param>
/// <param name="DeltaBic">BIC of the best other candidate minus BIC of the true one (&gt; 0: the true model wins).</param>
/// <param name="Bic">BIC per candidate, in candidate order.</param>
/// <param name="Converged">Whether every candidate's fit converged, and the mock's population redshift prior when one was estimated.</param>
/// <param name="Estimates">The true candidate's estimates of the recovered parameters (value, lo, hi of the 68% interval).</param>
public sealed record MockOutcome(int SampleSize, int Mock, long Seed, string Winner, double DeltaBic, IReadOnlyList<double> Bic, bool Converged,
    IReadOnlyList<Inference.ParameterEstimate> Estimates);

/// <summary>Recovery of one nuisance parameter by the true model's fit over the mocks of one sample size.</summary>
/// <param name="Name">Parameter (e.g. <c>size_evolution</c>).</param>
/// <param name="Truth">True value.</param>
/// <param name="Bias">Mean of (estimate − truth).</param>
/// <param name="BiasError">Standard error of the bias, spread/√K.</param>
/// <param name="Spread">Standard deviation of the estimates.</param>
/// <param name="MedianError">Median of the reported 1σ half-widths ((hi − lo)/2).</param>
/// <param name="Coverage">Fraction of mocks whose 68% interval contains the truth (nominal 0.683).</param>
/// <param name="CoverageCount">Mocks with an interval (the denominator of <paramref name="Coverage"/>).</param>
public sealed record ParameterRecovery(string Name, double Truth, double Bias, double BiasError, double Spread, double MedianError, double Coverage, int CoverageCount);

/// <summary>The statistics of one sample size.</summary>
/// <param name="SampleSize">N.</param>
/// <param name="Mocks">K.</param>
/// <param name="ProbabilityTrueBest">Fraction of mocks where the true model has the lowest BIC.</param>
/// <param name="ProbabilityStrong">Fraction where it wins by ΔBIC &gt; 6 ("strong", Kass &amp; Raftery 1995).</param>
/// <param name="ProbabilityDecisive">Fraction where it wins by ΔBIC &gt; 10 ("very strong", Kass &amp; Raftery 1995).</param>
/// <param name="DeltaBicQuantiles">ΔBIC at the 5, 16, 50, 84 and 95 % points of the mocks.</param>
/// <param name="DeltaBicMean">Mean ΔBIC.</param>
/// <param name="Recovery">Recovery of each evolution (and scatter) parameter by the true model.</param>
/// <param name="NotConverged">Mocks in which at least one fit (or the population redshift prior's EM iteration) did not converge.</param>
/// <param name="Verdict"><c>decisive</c>, <c>strong</c>, <c>weak</c>, <c>unable to decide</c>, <c>favours a wrong model</c> (median
/// ΔBIC &lt; −2) or, withheld, <c>not interpretable: the true model is not recovered</c> (see <see cref="PowerAnalysis"/>).</param>
public sealed record PowerPoint(int SampleSize, int Mocks, double ProbabilityTrueBest, double ProbabilityStrong, double ProbabilityDecisive,
    IReadOnlyList<double> DeltaBicQuantiles, double DeltaBicMean, IReadOnlyList<ParameterRecovery> Recovery, int NotConverged, string Verdict)
{
    /// <summary>Why the verdict was withheld: each parameter the true model failed to recover (empty when it recovered all).</summary>
    public IReadOnlyList<string> RecoveryFailures { get; init; } = [];
}

/// <summary>The whole power analysis (serialised as <c>power.json</c>).</summary>
public sealed record PowerResult
{
    /// <summary>Layout version of power.json.</summary>
    public int SchemaVersion { get; init; } = 1;
    /// <summary>Always true: every catalogue behind these numbers is synthetic.</summary>
    public bool Synthetic { get; init; } = true;
    /// <summary>The true world model's name and parameters.</summary>
    public required string TrueModel { get; init; }
    /// <summary>The true model's parameter values.</summary>
    public required IReadOnlyDictionary<string, double> TrueModelParameters { get; init; }
    /// <summary>The true values of the nuisance parameters, by fit-parameter name.</summary>
    public required IReadOnlyDictionary<string, double> TrueNuisance { get; init; }
    /// <summary>Candidate labels, in order.</summary>
    public required IReadOnlyList<string> Candidates { get; init; }
    /// <summary>The candidate matching the truth.</summary>
    public required string TrueCandidate { get; init; }
    /// <summary>Observable fitted (written <c>size</c>, <c>sb</c>, <c>joint</c>).</summary>
    public required Inference.ObservableKind Observable { get; init; }
    /// <summary>Kind of object simulated.</summary>
    public required string Kind { get; init; }
    /// <summary>The redshift distribution.</summary>
    public required string ZDist { get; init; }
    /// <summary>Base seed.</summary>
    public required long Seed { get; init; }
    /// <summary>Mocks per sample size.</summary>
    public required int Mocks { get; init; }
    /// <summary>Decisive-power threshold.</summary>
    public required double TargetPower { get; init; }
    /// <summary>ΔBIC of a "strong" win, the threshold of <see cref="PowerPoint.ProbabilityStrong"/> (6; a power.json written before
    /// the field existed reads as 6, the value then).</summary>
    public double StrongDeltaBic { get; init; } = PowerAnalysis.StrongDeltaBic;
    /// <summary>ΔBIC of a "decisive" win, the threshold of <see cref="PowerPoint.ProbabilityDecisive"/> and of <see cref="TargetPower"/> (10;
    /// an older power.json reads as 10).</summary>
    public double DecisiveDeltaBic { get; init; } = PowerAnalysis.DecisiveDeltaBic;
    /// <summary>Per sample size, ascending.</summary>
    public required IReadOnlyList<PowerPoint> Points { get; init; }
    /// <summary>Smallest N in the grid whose P(ΔBIC &gt; 10) reaches the target, or null.</summary>
    public int? RequiredSampleSize { get; init; }
    /// <summary>One-sentence conclusion.</summary>
    public required string Conclusion { get; init; }
    /// <summary>Caveats.</summary>
    public IReadOnlyList<string> Notes { get; init; } = [];
    /// <summary>Every mock's outcome.</summary>
    public required IReadOnlyList<MockOutcome> Outcomes { get; init; }
}

using SizeTest.Foundation.Errors;
using SizeTest.Photometry;

namespace SizeTest.Inference;

/// <summary>What a fit study needs: the hypotheses, the sample and its counts, and the work to do.</summary>
public sealed record FitRequest
{
    /// <summary>Hypotheses to fit and compare (one per world model).</summary>
    public required IReadOnlyList<Hypothesis> Hypotheses { get; init; }
    /// <summary>The observables.</summary>
    public required Observables Observables { get; init; }
    /// <summary>Source name for the record.</summary>
    public string Source { get; init; } = "";
    /// <summary>Rows read (defaults to the number of objects).</summary>
    public long? RowsRead { get; init; }
    /// <summary>Rows rejected by the loader.</summary>
    public long Rejected { get; init; }
    /// <summary>Seed of every random process.</summary>
    public int Seed { get; init; } = 1;
    /// <summary>Optimiser starts per model.</summary>
    public int Starts { get; init; } = 4;
    /// <summary>Bootstrap resamples per model (0: none).</summary>
    public int Bootstrap { get; init; }
    /// <summary>Cross-validation folds (0: none).</summary>
    public int CrossValidationFolds { get; init; }
    /// <summary>Grid points of the whole-range profile scan of each free cosmological parameter that looks for missed
    /// maxima before the intervals are assessed (<see cref="ModeSearch"/>; 0: no scan).</summary>
    public int ModeScanPoints { get; init; } = ModeSearch.DefaultGridPoints;
    /// <summary>Parameter to profile in every model where it is free, or null.</summary>
    public string? ProfileParameter { get; init; }
    /// <summary>Expected ranges for the evolution parameters.</summary>
    public IReadOnlyList<ExpectedRange> Expected { get; init; } = [];
    /// <summary>Posterior sampling after each fit: <c>none</c>, <c>mcmc</c> (Goodman–Weare ensemble) or <c>nested</c> (Skilling).</summary>
    public SamplerKind Sampler { get; init; } = SamplerKind.None;
    /// <summary>MCMC walkers.</summary>
    public int Walkers { get; init; } = 32;
    /// <summary>MCMC steps per walker; 0 (<c>--steps auto</c>, the default): run in blocks until the convergence rules
    /// hold or <see cref="MaxSteps"/> is reached.</summary>
    public int Steps { get; init; }
    /// <summary>MCMC with <see cref="Steps"/> = 0: the most steps per walker before the run stops as not converged.</summary>
    public int MaxSteps { get; init; } = Sampling.ChainMemory.DefaultMaxSteps;
    /// <summary>Bytes the MCMC chain store may hold (walkers × max steps × (parameters + 1) × 8 B is checked before sampling).</summary>
    public long ChainMemoryBudget { get; init; } = Sampling.ChainMemory.DefaultBudgetBytes;
    /// <summary>Where the likelihood sums are evaluated (threads, or MPI ranks over row slices); null: threads in this
    /// process over <see cref="Observables"/>. Under MPI, <see cref="Observables"/> is this rank's share.</summary>
    public Evaluation.EvaluationBackend? Backend { get; init; }
    /// <summary>MCMC proposal; null for <see cref="Sampling.MixtureMove.Default"/> (kernel-density + differential evolution + stretch).</summary>
    public Sampling.IEnsembleMove? SamplerMove { get; init; }
    /// <summary>Nested-sampling live points.</summary>
    public int LivePoints { get; init; } = 400;
    /// <summary>Makes a chain store for a model's MCMC chain (e.g. a CSV file), or null to keep it in memory only.
    /// Stores that are <see cref="IDisposable"/> are disposed after the run.</summary>
    public Func<string, Sampling.IChainStore?>? ChainStoreFactory { get; init; }
    /// <summary>When set, each model's stages (fit, mode search and intervals, evolution tests, bootstrap, CV) are marked on it.</summary>
    public SizeTest.Foundation.Profiling.StageTimings? Timings { get; init; }

    /// <summary>
    /// The problems with the request's settings (empty when it can run), each naming the setting: at least one
    /// start, no negative bootstrap count, 0 or ≥ 2 folds, and for the samplers at least 4 walkers, 10 steps (or
    /// 0: auto), 10 maximum steps and 10 live points. The sample is not looked at, so a caller can check the
    /// settings before it loads one; <see cref="FitRun.Run"/> refuses a request with problems.
    /// </summary>
    public IReadOnlyList<SettingProblem> Validate()
    {
        var problems = new List<SettingProblem>();
        if (Bootstrap < 0) problems.Add(new("{bootstrap} must be 0 or more"));
        if (CrossValidationFolds is < 0 or 1) problems.Add(new("{cv_folds} must be 0 (none) or at least 2"));
        if (Starts < 1) problems.Add(new("{starts} must be at least 1"));
        if (Walkers < 4 || (Steps != 0 && Steps < 10) || LivePoints < 10) problems.Add(new("{walkers} needs at least 4, {steps} and {live_points} at least 10"));
        if (MaxSteps < 10) problems.Add(new("{max_steps} must be at least 10"));
        return problems;
    }
}

/// <summary>Progress of a study: a stage name and how far it is.</summary>
/// <param name="Stage">What is running (e.g. "bootstrap lcdm").</param>
/// <param name="Done">Units done.</param>
/// <param name="Total">Units in this stage.</param>
public sealed record FitProgress(string Stage, int Done, int Total)
{
    /// <summary>Extra words for the progress line (e.g. "τ 130, ETA 4 s"), or null.</summary>
    public string? Detail { get; init; }
}

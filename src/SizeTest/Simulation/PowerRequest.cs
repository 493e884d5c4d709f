using SizeTest.Foundation.Errors;
using SizeTest.Inference;

namespace SizeTest.Simulation;

/// <summary>
/// A power analysis: K mock surveys of a design drawn under a true world model, each fitted with every
/// candidate hypothesis, repeated over a grid of sample sizes.
/// </summary>
/// <param name="Template">The true world model, population and design; its <see cref="SurveyDesign.Count"/> is replaced by each
/// entry of <paramref name="SampleSizes"/> and its <see cref="MockSurveySpec.Seed"/> is the base seed of the mock seeds.</param>
/// <param name="Candidates">Hypotheses fitted to each mock (one per world model).</param>
/// <param name="TrueCandidate">Label of the candidate that matches the truth (its fit gives the recovered parameters).</param>
/// <param name="Mocks">Mocks per sample size, K ≥ 1.</param>
/// <param name="SampleSizes">Grid of catalogue sizes N (ascending after sorting).</param>
/// <param name="TargetPower">Probability of a decisive win (ΔBIC &gt; 10) that counts as "decisive" (default 0.9).</param>
/// <param name="Starts">Optimiser starts per fit (default 1: the data-driven start plus the fitter's restarts).</param>
/// <param name="MaxThreads">Most threads (default: all cores).</param>
public sealed record PowerRequest(
    MockSurveySpec Template,
    IReadOnlyList<Hypothesis> Candidates,
    string TrueCandidate,
    int Mocks,
    IReadOnlyList<int> SampleSizes,
    double TargetPower = 0.9,
    int Starts = 1,
    int? MaxThreads = null)
{
    /// <summary>
    /// The survey terms of the candidate fits (size–luminosity relation, groups, photometric redshifts), built for each mock as fit
    /// builds them for a catalogue (<see cref="Inference.Survey.SurveyRequest.Build"/>); null: none (<see cref="PowerCandidates.Survey"/>).
    /// </summary>
    public Inference.Survey.SurveyRequest? Survey { get; init; }

    /// <summary>The problems with the request's settings (empty when it can run), each naming the setting
    /// (<see cref="SettingProblem"/>): two or more candidates including the true one, K ≥ 1 mocks, sample sizes of
    /// at least 10, a target power in (0, 1), at least one start and one thread.</summary>
    public IReadOnlyList<SettingProblem> Problems()
    {
        ArgumentNullException.ThrowIfNull(Candidates);
        var problems = new List<SettingProblem>();
        if (Candidates.Count < 2) problems.Add(new("a power analysis needs at least two candidate world models to compare"));
        else if (Candidates.All(c => c.Label != TrueCandidate))
            problems.Add(new($"the true model '{TrueCandidate}' is not among the candidates ({string.Join(", ", Candidates.Select(c => c.Label))}); add it to {{models}}"));
        if (Mocks < 1) problems.Add(new($"{{mocks}} must be at least 1; got {Mocks}"));
        if (SampleSizes is null || SampleSizes.Count == 0 || SampleSizes.Any(n => n < 10))
            problems.Add(new("{sample_sizes} needs one or more sample sizes of at least 10 objects, e.g. {sample_sizes} 250,500,1000,2000"));
        if (!(TargetPower > 0 && TargetPower < 1)) problems.Add(new(FormattableString.Invariant($"{{target_power}} must be between 0 and 1; got {TargetPower}")));
        if (Starts < 1) problems.Add(new("{starts} must be at least 1"));
        if (MaxThreads is < 1) problems.Add(new("{threads} must be at least 1"));
        return problems;
    }

    /// <summary>Checks the request: throws an <see cref="InputException"/> carrying <see cref="Problems"/>, then
    /// checks the mock survey template.</summary>
    public void Validate()
    {
        ArgumentNullException.ThrowIfNull(Template);
        SettingProblem.ThrowIfAny(Problems());
        Template.Validate();
    }

    /// <summary>Bytes per object of one mock being fitted: the drawn catalogue (≈ 240 B, as for <c>simulate</c>) and
    /// the likelihood's per-object columns and scratch (≈ 760 B, measured loosely on a 200 000-object fit).</summary>
    public const double BytesPerMockObject = 1000;

    /// <summary>Bytes kept per mock outcome: its BIC per candidate and the true model's estimates.</summary>
    private double BytesPerOutcome =>
        200 + 16.0 * Candidates.Count + 160.0 * Candidates.Max(c => c.FreeParameters.Count);

    /// <summary>
    /// Memory the analysis needs, estimated before anything is allocated (bytes, as a double so huge counts
    /// cannot overflow): the mock seeds and outcomes (mocks × sample sizes), plus one mock catalogue and its
    /// likelihood per thread at the largest sample size.
    /// </summary>
    public double EstimatedMemoryBytes()
    {
        double outcomes = (double)Mocks * SampleSizes.Distinct().Count();
        int threads = Math.Min(MaxThreads ?? Environment.ProcessorCount, (int)Math.Min(outcomes, int.MaxValue));
        return 8.0 * Mocks + outcomes * BytesPerOutcome + threads * BytesPerMockObject * SampleSizes.Max();
    }

    /// <summary>What <see cref="EstimatedMemoryBytes"/> covers, naming the settings that size it (for the budget message).</summary>
    public string MemoryDescription() =>
        $"the power analysis ({Mocks} mocks × {SampleSizes.Distinct().Count()} sample size{(SampleSizes.Distinct().Count() == 1 ? "" : "s")} up to N = {SampleSizes.Max()}, {Candidates.Count} models each: {FitCount((double)Mocks * SampleSizes.Distinct().Count() * Candidates.Count)} fits)";

    // A count of fits as people write it: digits up to 10⁹ (400, 2 000 000), then scientific (4e+12).
    private static string FitCount(double n) => n < 1e9
        ? n.ToString("#,0", System.Globalization.CultureInfo.InvariantCulture).Replace(",", " ", StringComparison.Ordinal)
        : n.ToString("0.###e+0", System.Globalization.CultureInfo.InvariantCulture);
}

/// <summary>Progress of a power analysis: mocks fitted so far out of the total (over all sample sizes).</summary>
/// <param name="Done">Mocks fitted.</param>
/// <param name="Total">Mocks in the whole analysis.</param>
public sealed record PowerProgress(int Done, int Total);

using SizeTest.Foundation.Errors;
using SizeTest.Inference.Comparison;

namespace SizeTest.Inference;

/// <summary>
/// The one-call facade: fit every hypothesis by maximum likelihood, test whether each needs its evolution terms,
/// optionally bootstrap, cross-validate and profile, and rank the models.
/// </summary>
public static class FitRun
{

    /// <summary>Runs the study. Physics only: no I/O; progress goes to <paramref name="progress"/>.</summary>
    public static FitResult Run(FitRequest request, IProgress<FitProgress>? progress = null, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(request);
        if (request.Hypotheses.Count == 0) throw new ArgumentException("no world models to fit");
        SizeTest.Foundation.Errors.SettingProblem.ThrowIfAny(request.Validate());
        if (request.Sampler == SamplerKind.Mcmc)
            foreach (var h in request.Hypotheses.Where(h => h.K > 0))
                Sampling.ChainMemory.Check(request.Walkers, request.Steps > 0 ? request.Steps : request.MaxSteps, h.K, request.ChainMemoryBudget);
        var backend = request.Backend ?? Evaluation.EvaluationBackend.InProcess(request.Observables);
        if (!backend.IsRoot) progress = null;
        var obs = backend.Local;
        int total = backend.TotalObjects;
        SampleSizeCheck.RefuseUnidentifiable(request.Hypotheses, total);
        SampleSizeCheck.RefuseSmallGroups(request.Hypotheses, backend.Concurrent ? obs.Survey.Group : null);
        var extraNotes = new List<string>();
        if (SampleSizeCheck.Warning(request.Hypotheses, total) is { } small) extraNotes.Add(small);
        if (backend.TotalWeight != total)
            extraNotes.Add(string.Create(System.Globalization.CultureInfo.InvariantCulture,
                $"weights: the fit maximises Σ w ln p; AICc and BIC take n = Σ w = {backend.TotalWeight:G6} (frequency weights: an object of weight w counts as w observations), not the {total} objects"));

        int cvFolds = request.CrossValidationFolds;
        if (cvFolds > total)
        {
            extraNotes.Add($"cross-validation asked for {cvFolds} folds but the sample has {total} objects: capped at {total} folds (leave-one-out)");
            cvFolds = total;
        }
        // One fold assignment from the seed for every model (over the whole sample's positions), so CV differences are paired.
        int[]? foldOf = cvFolds > 1 ? CrossValidation.AssignFolds(total, cvFolds, request.Seed) : null;
        var summaries = new List<ModelFitSummary>();
        var lrts = new List<LikelihoodRatioTest>();
        var boots = new List<BootstrapResult>();
        var cvs = new List<CrossValidationResult>();
        var profiles = new List<ProfileLikelihoodResult>();
        var required = new List<RequiredEvolution>();
        var samples = new List<PosteriorDraws>();
        var chains = new List<ChainSummary>();
        var opt = new OptimizerSettings(Starts: request.Starts, Seed: request.Seed);
        int m = 0;
        foreach (var h in request.Hypotheses)
        {
            cancel.ThrowIfCancellationRequested();
            progress?.Report(new FitProgress($"fitting {h.Label}", m, request.Hypotheses.Count));
            var lik = backend.Bind(h);
            var fit = MaximumLikelihood.Fit(lik, lik.Posterior, h.FreeParameters, backend.SuggestStart(h), opt);
            request.Timings?.Mark($"bind + multi-start fit {h.Label}");
            var refined = ModelFitRefinement.Run(backend, lik, fit, request.ModeScanPoints, cancel, posteriorFollows: request.Sampler != SamplerKind.None && h.K > 0);
            request.Timings?.Mark($"mode search + intervals {h.Label}");
            fit = refined.Best;
            var summary = refined.Summary;
            extraNotes.AddRange(refined.Notes);
            if (request.Sampler != SamplerKind.None)
            {
                var (sampled, draws) = PosteriorSampling.Run(h, lik, lik.Posterior, fit, summary, request, unchecked(request.Seed + 31 * m), progress, cancel);
                summary = ModelFitRefinement.MarkPosterior(sampled);
                if (draws is not null)
                {
                    samples.Add(draws);
                    if (draws.Chain is { } chain) chains.Add(chain);
                }
            }
            summaries.Add(summary);

            foreach (var name in Comparison.EvolutionTestTable.EvolutionNames(summary.Parameters.Select(p => p.Name)).ToArray())
            {
                var est = summary.Parameters.FirstOrDefault(p => p.Name == name);
                if (est is null) continue;
                LikelihoodRatioTest? lrt = null;
                if (!est.Fixed && h.FreeParameters.First(p => p.Name == name) is { } spec && spec.Min <= 0 && spec.Max >= 0)
                {
                    var nlik = lik.WithFixed(name, 0); // shares the bound rows and the redshift grid
                    var nested = nlik.Hypothesis;
                    int j = h.FreeParameters.ToList().FindIndex(p => p.Name == name);
                    var start = fit.Theta.Where((_, k) => k != j).ToArray();
                    var nfit = MaximumLikelihood.Fit(nlik, nlik.Posterior, nested.FreeParameters, start, opt, covariance: false);
                    lrt = LikelihoodRatioTest.Compute(h.Label, name, 0, fit.LogLikelihood, nfit.LogLikelihood, 1);
                    lrts.Add(lrt);
                }
                required.Add(RequiredEvolution.Assess(h.Label, est, lrt, request.Expected.FirstOrDefault(e => e.Parameter == name || e.Parameter == Comparison.EvolutionTestTable.BaseName(name)),
                    h.Nuisance.SbAtFixedLuminosity, obs.Survey.CompactRadioSources));
            }

            request.Timings?.Mark($"evolution tests {h.Label}");
            if (request.Bootstrap > 0 && h.K > 0)
            {
                string stage = $"bootstrap {h.Label}";
                int resamples = request.Bootstrap;
                progress?.Report(new FitProgress(stage, 0, resamples));
                boots.Add(Bootstrap.Run(backend, h, fit.Theta, resamples, unchecked(request.Seed + 7 * m),
                    done => progress?.Report(new FitProgress(stage, done, resamples)), cancel));
                request.Timings?.Mark($"bootstrap {h.Label}");
            }
            if (foldOf is not null && h.K > 0)
            {
                cvs.Add(CrossValidation.Run(backend, h, foldOf, cvFolds, fit.Theta, lik));
                request.Timings?.Mark($"cross-validation {h.Label}");
            }
            if (request.ProfileParameter is { } pp && h.FreeParameters.Any(p => p.Name == pp))
            {
                profiles.Add(ProfileLikelihood.Run(backend, h, fit, pp));
                request.Timings?.Mark($"profile {h.Label}");
            }
            m++;
            progress?.Report(new FitProgress($"fitted {h.Label}", m, request.Hypotheses.Count));
        }
        var ranked = ModelComparison.Rank(summaries);
        var first = request.Hypotheses[0].Nuisance;
        var notes = StudyNotes(request.Hypotheses, ranked, request.Sampler);
        notes.AddRange(extraNotes);
        if (PhysicalSizePlausibility.Note(ranked) is { } sizeScale) notes.Insert(0, sizeScale);
        if (obs.Survey.CompactRadioSources)
            notes.Add("compact radio sources (the catalogue has radio flux densities): the shipped expectations for galaxy size and SB evolution are not applied, so no evolution is judged plausible or implausible unless the study states its own range ({expect} size_evolution=LO:HI)");
        if (first.SurveyTerms.Groups is { Count: > 1 } groups)
            notes.Add(SettingProblem.Text($"populations {string.Join(", ", groups)}: the required evolution is stated for each group ({(first.Observable switch { ObservableKind.Size => "size_evolution@GROUP", ObservableKind.SurfaceBrightness => "sb_evolution@GROUP", _ => "size_evolution@GROUP and sb_evolution@GROUP" })}, each with its own likelihood-ratio test against 0); the model comparison (AIC, BIC, weights, Bayes factors) is one combined comparison over all groups, with the world model shared"));
        if (ranked.Count > 1 && ranked[0].Tied)
            notes.Insert(0, $"models {string.Join(", ", ranked.Where(r => r.Rank == 1).Select(r => r.Name))} tie (AIC and BIC equal within {ModelComparison.TieTolerance}): none is ranked first");
        if (!backend.Concurrent)
            notes.Add($"fitted on {backend.Description}: each rank summed the likelihood of its own rows in fixed chunks and one Allreduce per evaluation gathered the chunk sums, added in one order, so every number is the same for any number of ranks");
        if (request.Bootstrap > 0)
            notes.Add("the bootstrap is a Poisson bootstrap: each replicate weights every row by a Poisson(1) count drawn from (seed, replicate, row), so it does not depend on the number of ranks");
        if (first.Observable != ObservableKind.SurfaceBrightness && obs.SizeDefinition.Kind == Catalogues.SizeKind.Isophotal)
            notes.Insert(Math.Min(2, notes.Count), "sizes are isophotal: the model's ln θ adds ln(r_iso/R_e) for a Sérsic profile at each model's mean observed SB at R_e (mu0 read as the SB at R_e); a parameter vector under which an object's isophote is not reached has ln L = −∞");
        var settings = new FitSettings(
            first.Observable,
            first.Cuts, first.SizeSbRelation, first.PivotSizeKpc, first.DimmingExponentOffset, first.NodesFor(total),
            request.Starts, request.Bootstrap, request.CrossValidationFolds, request.Sampler, request.Walkers, request.Steps, request.LivePoints,
            request.ProfileParameter, request.Expected, request.Seed, Survey.SurveySettings.From(first.SurveyTerms), obs.Survey.CompactRadioSources);
        // Models that cannot be ranked against each other (Comparison.StudyVerdict.NotComparable: a luminosity window in each model's own
        // D_L, binned evolution) get no rank, no Akaike weight and no Bayes factors in the machine outputs either, so results.json and
        // results.csv cannot rank what the verdict refuses to (ΔAIC/ΔBIC stay, as differences of the criteria).
        bool comparable = Comparison.StudyVerdict.NotComparable(settings) is null;
        if (!comparable)
        {
            ranked = ranked.Select(m => m with { Rank = 0, Tied = false, AkaikeWeight = double.NaN }).ToList();
            notes.Insert(0, "the models are not ranked (see the verdict): no rank, Akaike weight or Bayes factor is given; ΔAIC and ΔBIC are differences of criteria over different data or bin-dependent fits, not evidence");
        }
        return new FitResult
        {
            Source = request.Source,
            RowsRead = request.RowsRead ?? total + request.Rejected,
            Accepted = total,
            Rejected = request.Rejected,
            Seed = request.Seed,
            Settings = settings,
            Models = ranked,
            BayesFactors = comparable ? ModelComparison.BayesFactors(ranked) : [],
            LikelihoodRatioTests = lrts,
            RequiredEvolution = required,
            Bootstrap = boots,
            CrossValidation = cvs,
            CrossValidationDifferences = CrossValidationComparison.Compare(cvs),
            Profiles = profiles,
            Notes = notes,
            Samples = samples,
            Chains = chains,
        };
    }

    /// <summary>The caveats FitRun adds to every study.</summary>
    internal static List<string> StudyNotes(IReadOnlyList<Hypothesis> hypotheses, IReadOnlyList<ModelFitSummary> ranked, SamplerKind sampler)
    {
        var first = hypotheses[0].Nuisance;
        var notes = new List<string>();
        if (first.Observable != ObservableKind.SurfaceBrightness)
            notes.Add("angular sizes constrain only R0·H0 (D_A ∝ 1/H0): h0 is held fixed unless freed, and r0_kpc is in kpc for that h0");
        if (first.Observable != ObservableKind.Size)
            notes.Add("surface-brightness dimming uses each model's bolometric exponent (4 for FLRW, dimming_exponent for static models)"
                      + (first.DimmingExponentOffset != 0 ? $" plus the band offset {first.DimmingExponentOffset}" : "") + "; K-corrections and extinction enter additively");
        if (first.Observable == ObservableKind.SurfaceBrightness && hypotheses.All(h => h.FreeParameters.Any(p => p.Name == NuisanceParameters.Names.SbEvolution)))
            notes.Add("with sb_evolution free, surface brightness alone constrains only n − b, so every world model fits equally well; compare the evolution b each model needs with an expectation ({expect} sb_evolution=LO:HI), or fit {observable} joint");
        if (!first.Cuts.IsEmpty)
        {
            // With the size–luminosity relation a joint fit conditions on the magnitudes a magnitude limit selects on (SurveyJointLikelihood).
            bool magConditioned = first.MagLimitIsConditioned;
            if (!(magConditioned && first.Cuts with { MagLimit = null } == SelectionLimits.None))
                notes.Add("selection cuts are modelled as per-object truncations of the Gaussian likelihood" +
                          (magConditioned ? " (not the magnitude limit: with the size–luminosity relation the fit is conditional on the magnitudes it selects on)" : ""));
        }
        if (ranked.Any(r => !r.Converged)) notes.Add("at least one fit did not converge; its numbers are not reliable");
        if (ranked.Count > 1 && ranked.All(r => r.LogEvidence is null)) notes.Add("Bayes factors are BIC approximations (no evidence computed)");
        if (sampler == SamplerKind.Mcmc) notes.Add("parameters are posterior medians with 16th–84th percentiles from the ensemble sampler; evidences are Laplace approximations at the maximum, so Bayes factors depend on the prior bounds");
        if (sampler == SamplerKind.Nested) notes.Add("parameters are posterior medians with 16th–84th percentiles from nested sampling; Bayes factors use its evidences and depend on the prior bounds");
        return notes;
    }
}

using System.CommandLine;
using SizeTest.Catalogues;
using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Files;
using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Inference.Survey;
using SizeTest.Photometry;
using SizeTest.Foundation.Text;

namespace SizeTest.Cli;

/// <summary>
/// <c>sizetest fit CATALOG --out DIR</c>: loads a catalogue, fits every requested world model with its nuisance
/// model, compares them and writes <c>DIR/results.json</c>, <c>DIR/results.csv</c> and <c>DIR/rejects.csv</c>;
/// prints the ranked table. Exit 1 when a fit did not converge (outputs are still written), 2 on bad input.
/// </summary>
internal static class FitCommand
{
    public static Command Create(CliContext context)
    {
        var command = new Command("fit", "Fit world models to a catalogue's angular sizes and/or surface brightnesses, rank them and report the evolution each needs.");
        var catalogue = new Argument<string>("CATALOG") { Description = "Catalogue file (CSV, whitespace text, FITS BINTABLE or VOTable)." };
        var catalogueOptions = new CatalogueOptions();
        var photometryOptions = new PhotometryCliOptions();
        var surveyOptions = new SurveyCliOptions();
        var choice = new CandidateModelOptions($"Comma-separated world models ({string.Join(", ", WorldModels.Names)}).",
            "NAME=VALUE: hold a parameter fixed (e.g. size_evolution=0); repeatable.", "Parameter(s) to fit (e.g. omega_m); repeatable or comma-separated.");
        var limits = new OutputLimitOptions("Replace an existing output folder.", "a fit whose estimated memory (chains, resamples, starts, live points)");
        var observable = new Option<string>("--observable") { Description = "What to fit: size (ln θ), sb (Tolman surface brightness) or joint.", DefaultValueFactory = _ => "size" };
        OneOf(observable, "--observable", [.. ObservableKinds.Names]);
        var relation = new Option<bool>("--size-sb-relation") { Description = "Joint only: link μ to log10 physical size with a free Kormendy-type slope (kormendy_slope), so the SB test is at matched physical size." };
        var pivot = new Option<double>("--pivot-kpc") { Description = "Pivot physical size of the size–SB relation, kpc (mu0 is the SB at this size).", DefaultValueFactory = _ => 5.0 };
        var dimOffset = new Option<double>("--dimming-offset") { Description = "Added to every model's bolometric dimming exponent: −1 for f_ν (AB) band SB without a bandwidth K-correction, +1 for f_λ; 0 when bolometric or K-corrected.", DefaultValueFactory = _ => 0.0 };
        var prior = new Option<string[]>("--prior") { Description = "NAME=MEAN,SD: free with a Gaussian prior (truncated to the bounds); repeatable." };
        var bound = new Option<string[]>("--bound") { Description = "NAME=LO:HI: narrower bounds for a free parameter; repeatable." };
        var bootstrap = new Option<int>("--bootstrap") { Description = "Bootstrap resamples per model (0: none).", DefaultValueFactory = _ => 0 };
        var folds = new Option<int>("--cv-folds") { Description = "Folds of the cross-validated log predictive density (0: none).", DefaultValueFactory = _ => 5 };
        var profile = new Option<string?>("--profile") { Description = "Parameter to profile (writes profile_MODEL_NAME.csv)." };
        var sampler = new Option<string>("--sampler") { Description = "Posterior sampling after the fit: none, mcmc or nested.", DefaultValueFactory = _ => "none" };
        OneOf(sampler, "--sampler", [.. SamplerKinds.Names]);
        var walkers = new Option<int>("--walkers") { Description = "MCMC: ensemble walkers.", DefaultValueFactory = _ => 32 };
        var steps = new Option<string>("--steps") { Description = "MCMC: steps per walker, or auto: run in blocks until ≥ 50 τ, split-R̂ ≤ 1.01 and ESS ≥ 400 hold (or --max-steps is reached: not converged, exit 1).", DefaultValueFactory = _ => "auto" };
        var maxSteps = new Option<int>("--max-steps") { Description = "MCMC with --steps auto: the most steps per walker.", DefaultValueFactory = _ => SizeTest.Inference.Sampling.ChainMemory.DefaultMaxSteps };
        var live = new Option<int>("--live-points") { Description = "Nested sampling: live points.", DefaultValueFactory = _ => 400 };
        var seed = new Option<int>("--seed") { Description = "Seed of every random process (starts, bootstrap, folds).", DefaultValueFactory = _ => 1 };
        var starts = new Option<int>("--starts") { Description = "Optimiser starting points per model.", DefaultValueFactory = _ => 4 };
        var sbLimit = new Option<double?>("--sb-limit") { Description = "Survey surface-brightness limit μ < MU (mag/arcsec²), modelled as a truncation." };
        var magLimit = new Option<double?>("--mag-limit") { Description = "Survey magnitude limit m < M: a truncation in μ and θ with --observable joint; with --size-luminosity (size or joint) the fit conditions on the magnitudes it selects on, so it is no truncation (rows are checked on the mag column)." };
        var minSize = new Option<double?>("--min-size") { Description = "Smallest resolvable angular size θ > ARCSEC, modelled as a truncation." };
        var expect = new Option<string[]>("--expect") { Description = "NAME=LO:HI: expected range of an evolution parameter (e.g. size_evolution=-1.5:-0.7); repeatable." };
        var maxOutside = new Option<double>("--max-outside-selection") { Description = "Largest fraction (0–1) of objects that may lie outside --sb-limit/--mag-limit/--min-size; they go to the reject log, and beyond it the fit is refused.", DefaultValueFactory = _ => SelectionConsistency.DefaultMaxOutsideFraction };
        var nodes = new Option<int>("--grid-nodes") { Description = "Redshift-grid nodes for D_A (16–1024; 0 = automatic: 48 below 20 000 objects, 96 above).", DefaultValueFactory = _ => 0 };
        var output = new Option<string>("--out") { Description = "Output folder.", Required = true };
        var format = CliOptions.Format();
        command.Arguments.Add(catalogue);
        catalogueOptions.AddTo(command);
        photometryOptions.AddTo(command);
        surveyOptions.AddTo(command);
        foreach (var o in new Option[] { choice.Models, observable, relation, pivot, dimOffset, choice.Free, choice.Fix, choice.FluxConvention, prior, bound, bootstrap, folds, profile, sampler, walkers, steps, maxSteps, live, seed, starts, sbLimit, magLimit, minSize, maxOutside, limits.MaxMemory, expect, nodes, limits.Force, output, format })
            command.Options.Add(o);

        context.SetAction(command, parse =>
        {
            var kind = FitOptionParsing.Observable(parse.GetValue(observable)!);
            var surveyRequest = surveyOptions.Request(parse);
            // The size relation decides what a magnitude limit means, so the nuisance model carries it from the start (the sample's own
            // survey terms are bound once it is loaded).
            var nuisance = new NuisanceModel(kind,
                new SelectionLimits(parse.GetValue(sbLimit), parse.GetValue(magLimit), parse.GetValue(minSize)),
                parse.GetValue(relation), parse.GetValue(pivot), parse.GetValue(dimOffset), parse.GetValue(nodes), surveyRequest.RelationTerms);
            nuisance.Validate();
            var families = choice.Families(parse);
            if (families.Length == 0) throw new InputException("--models is empty; name at least one world model");
            var overrides = new ParameterOverrides(
                Free: choice.Freed(parse),
                Fixed: choice.Fixed(parse),
                Priors: FitOptionParsing.Priors(parse.GetValue(prior)),
                Bounds: FitOptionParsing.Ranges(parse.GetValue(bound), "--bound"));
            FitOptionParsing.CheckContradictions(overrides.Free!, overrides.Fixed!, overrides.Priors, overrides.Bounds);
            // --flux-convention holds luminosity_exponent of every static model, as --fix would.
            if (choice.ConventionExponent(parse, families, overrides.Names) is { } q)
                overrides = overrides with { Fixed = new Dictionary<string, double>(overrides.Fixed!, StringComparer.Ordinal) { [WorldModelParameters.Names.LuminosityExponent] = q } };
            var expected = FitOptionParsing.Ranges(parse.GetValue(expect), "--expect").Select(kv => new ExpectedRange(kv.Key, kv.Value.Lo, kv.Value.Hi)).ToArray();
            var luminosity = surveyOptions.Luminosity(parse, surveyRequest);
            bool surveyAsked = SurveyBinding.IsAsked(surveyRequest, parse.GetValue(surveyOptions.Group));
            if (!surveyAsked) CheckNames(overrides, expected, families, nuisance, parse.GetValue(profile));
            int nBoot = parse.GetValue(bootstrap), nFolds = parse.GetValue(folds), nStarts = parse.GetValue(starts);
            var samplerName = SamplerKinds.Parse(parse.GetValue(sampler) ?? "none");
            int nWalkers = parse.GetValue(walkers), nLive = parse.GetValue(live), nMax = parse.GetValue(maxSteps);
            int nSteps = FitOptionParsing.Steps(parse.GetValue(steps));
            var hypotheses = families.Select(f => Hypothesis.Create(f, nuisance, overrides)).ToArray();
            // The settings are checked by the library before the catalogue is read (FitRun.Run checks them again).
            SettingProblem.ThrowIfAny(new FitRequest
            {
                Hypotheses = hypotheses, Observables = new Observables([]), Starts = nStarts, Bootstrap = nBoot, CrossValidationFolds = nFolds,
                Sampler = samplerName, Walkers = nWalkers, Steps = nSteps, MaxSteps = nMax, LivePoints = nLive,
            }.Validate());
            long? memoryLimit = limits.MemoryLimit(parse);
            FitMemoryBudget.Check(hypotheses, samplerName, nWalkers, nSteps == 0 ? nMax : nSteps, nLive, nBoot, nStarts, memoryLimit);
            if (samplerName == SamplerKind.Mcmc)
                foreach (var h in hypotheses.Where(h => h.K > 0))
                    SizeTest.Inference.Sampling.ChainMemory.Check(nWalkers, nSteps > 0 ? nSteps : nMax, h.K, SizeTest.Inference.Sampling.ChainMemory.DefaultBudgetBytes);
            var inputs = new List<string> { parse.GetValue(catalogue)! };
            var photometry = photometryOptions.ToOptions(parse, inputs) with { Luminosity = luminosity };
            var loadOptions = catalogueOptions.ToLoadOptions(parse);
            if (parse.GetValue(surveyOptions.Group) is { } groupColumn)
                loadOptions = loadOptions with { Mapping = loadOptions.Mapping with { Assignments = [.. loadOptions.Mapping.Assignments.Where(a => a.Role != ColumnRole.Group), new ColumnAssignment(ColumnRole.Group, groupColumn)] } };
            if (SizeTest.Distributed.RankContext.IsDistributed && surveyRequest.NeedsWholeSample(parse.GetValue(surveyOptions.Group) is not null) is { Count: > 0 } whole)
                throw new InputException($"{SettingFlags.Text(string.Join(", ", whole))} do not run under mpirun (group labels and equal-count redshift bins need the whole sample in one process); run fit on one machine or drop {(whole.Count == 1 ? "it" : "them")}");
            string? profileName = parse.GetValue(profile);
            // Survey terms need the sample (group labels, bin edges, z_err): the hypotheses are rebuilt once it is loaded.
            Func<Observables, RedshiftGridSpan?, RedshiftPriorCoverage?, SurveyBinding> survey = (obs, whole, coverage) => SurveyBinding.Bind(surveyRequest, surveyAsked, obs, nuisance, hypotheses, nm =>
            {
                CheckNames(overrides, expected, families, nm, profileName);
                return families.Select(f => Hypothesis.Create(f, nm, overrides)).ToArray();
            }, whole, coverage);
            return FitRunner.Run(context, new FitArgs(parse.GetValue(catalogue)!, loadOptions, parse.GetValue(output)!, limits.Replace(parse), parse.GetValue(format), hypotheses, parse.GetValue(seed), nStarts, nBoot, nFolds, parse.GetValue(profile), expected, samplerName, nWalkers, nSteps, nMax, nLive, photometry) { CvFoldsExplicit = parse.GetResult(folds) is { Implicit: false }, Inputs = inputs, Survey = survey, SurveyTerms = surveyRequest, MaxOutsideSelection = parse.GetValue(maxOutside) });
        });
        return command;
    }

    // A validator rather than AcceptOnlyFromAmong: its message is one line.
    private static void OneOf(Option<string> option, string name, params string[] allowed) =>
        option.Validators.Add(result =>
        {
            string? v = result.GetValueOrDefault<string>();
            if (v is null || !allowed.Contains(v)) result.AddError($"{name} must be one of {string.Join(", ", allowed)}; got '{v}'{NameSuggestions.Hint(v ?? "", allowed)}.");
        });

    private static void CheckNames(ParameterOverrides o, IEnumerable<ExpectedRange> expected, IWorldModelFamily[] families, NuisanceModel nuisance, string? profile)
    {
        var known = families.SelectMany(f => f.Parameters.Select(p => p.Name))
            .Concat(NuisanceParameters.For(nuisance).Select(p => p.Name)).ToHashSet(StringComparer.Ordinal);
        foreach (var name in o.Names.Concat(expected.Select(e => e.Parameter)).Concat(profile is null ? [] : [profile]))
            if (!known.Contains(name))
                throw new InputException($"unknown parameter '{name}' for these models and --observable{NameSuggestions.Hint(name, known)}; known parameters are {string.Join(", ", known.Order(StringComparer.Ordinal))}");
    }
}

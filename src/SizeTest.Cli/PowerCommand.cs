using System.CommandLine;
using System.Globalization;
using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Files;
using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Simulation;

namespace SizeTest.Cli;

/// <summary>
/// <c>sizetest power</c>: K mock surveys of a design under a true world model, every candidate fitted to each;
/// writes <c>DIR/power.json</c>, <c>DIR/power.csv</c> and <c>DIR/mocks.csv</c> and prints the table per sample size.
/// Exit 0 when the analysis ran (whatever its verdict), 1 when no mock could be fitted, 2 on bad input.
/// </summary>
internal static class PowerCommand
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    public static Command Create(CliContext context)
    {
        var command = new Command("power", "Power analysis: can a survey design tell the world models apart? Fits every candidate model to K mocks drawn under a true model, over a grid of sample sizes.");
        var models = new WorldModelOptions("Static models: 'energy-loss' (D_L = d(1+z)^0.5, default) or 'time-dilation' (D_L = d(1+z)) for the true model when it is static and for every static candidate (as --fix luminosity_exponent=0.5 or 1).");
        var survey = new MockSurveyOptions("Sample sizes to try, comma-separated (e.g. 250,500,1000,2000).");
        var sizes = new Option<string?>("--n") { Description = "Sample sizes N to try, comma-separated (e.g. 250,500,1000,2000); default 2000." };
        var mocks = new Option<int>("--mocks") { Description = "Mocks per sample size (default 100).", DefaultValueFactory = _ => 100 };
        var choice = new CandidateModelOptions($"Candidate world models fitted to every mock, comma-separated ({string.Join(", ", WorldModels.Names)}).",
            "NAME=VALUE: hold a parameter fixed in every candidate's fit (e.g. size_evolution=0); repeatable.", "Parameter(s) to fit in every candidate (e.g. omega_m); repeatable or comma-separated.", models.FluxConvention);
        var limits = new OutputLimitOptions("Replace an existing output folder.", "an analysis whose estimated memory (mock outcomes, and one mock catalogue per thread at the largest N)");
        var observable = new Option<string?>("--observable") { Description = "What the fits use: size, sb or joint (default joint for galaxies, size for radio sources)." };
        observable.AcceptOnlyFromAmong([.. ObservableKinds.Names]);
        var target = new Option<double>("--target-power") { Description = "Fraction of mocks that must give ΔBIC > 10 for a decisive design (default 0.9).", DefaultValueFactory = _ => 0.9 };
        var starts = new Option<int>("--starts") { Description = "Optimiser starting points per fit (default 1).", DefaultValueFactory = _ => 1 };
        var threads = new Option<int?>("--threads") { Description = "Most threads to use (default: all cores)." };
        var seed = new Option<long?>("--seed") { Description = "Base seed of the mocks (required)." };
        var output = new Option<string?>("--out") { Description = "Output folder for power.json, power.csv and mocks.csv." };
        var format = CliOptions.Format();
        models.AddTo(command);
        command.Options.Add(sizes);
        survey.AddTo(command, includeCount: false);
        foreach (var o in new Option[] { mocks, choice.Models, observable, choice.Fix, choice.Free, target, starts, threads, seed, output, limits.Force, limits.MaxMemory, format }) command.Options.Add(o);
        command.SetAction(parse =>
        {
            OutputFolder? folder = null;
            try
            {
                long s = parse.GetValue(seed) ?? throw new InputException("--seed is required so that the mocks can be reproduced, e.g. --seed 1");
                string outDir = parse.GetValue(output) ?? throw new InputException("--out is required: the folder for power.json, power.csv and mocks.csv");
                var grid = ParseSizes(parse.GetValue(sizes) ?? "2000");
                // --flux-convention applies to the true model when it is static and to every static candidate.
                var trueModel = models.Create(parse, conventionForOtherModels: true);
                var design = survey.Design(parse, grid.Max());
                var template = new MockSurveySpec(trueModel, design, s, survey.Galaxies(parse), survey.Radio(parse), survey.Survey(parse));
                var kind = PowerCandidates.Observable(template, parse.GetValue(observable) is { } obsText ? FitOptionParsing.Observable(obsText) : null);
                var nuisance = PowerCandidates.Nuisance(template, kind);
                var (fixedValues, freed) = (choice.Fixed(parse), choice.Freed(parse));
                FitOptionParsing.CheckContradictions(freed, fixedValues);
                var families = choice.Families(parse);
                var trueFamily = WorldModels.Get(trueModel.Name);
                if (choice.ConventionExponent(parse, FluxConventions.Applies(trueFamily) ? [.. families, trueFamily] : families, [.. fixedValues.Keys, .. freed]) is { } q
                    && families.Any(FluxConventions.Applies))
                    fixedValues[WorldModelParameters.Names.LuminosityExponent] = q;
                var hypotheses = PowerCandidates.Create(trueModel, families, nuisance, fixedValues, freed);
                var request = new PowerRequest(template, hypotheses, trueModel.Name, parse.GetValue(mocks), grid, parse.GetValue(target), parse.GetValue(starts), parse.GetValue(threads))
                {
                    Survey = PowerCandidates.Survey(template, kind),
                };
                request.Validate();
                ResourceBudget.Check(request.MemoryDescription(), request.EstimatedMemoryBytes(), limits.MemoryLimit(parse));
                folder = OutputFolder.Begin(outDir, limits.Replace(parse));
                var result = PowerAnalysis.Run(request, new PowerProgressReporter(context));
                AtomicFile.WriteAllText(folder.PathOf("power.json"), PowerResultFiles.Json(result));
                AtomicFile.WriteAllText(folder.PathOf("power.csv"), PowerResultFiles.Csv(result));
                AtomicFile.WriteAllText(folder.PathOf("mocks.csv"), PowerResultFiles.MocksCsv(result));
                folder.Commit();
                folder = null;
                switch (parse.GetValue(format))
                {
                    case "json": context.Out.Write(PowerResultFiles.Json(result)); break;
                    case "csv": context.Out.Write(PowerResultFiles.Csv(result)); break;
                    default: WriteTable(context.Out, result); break;
                }
                if (result.Outcomes.All(o => double.IsPositiveInfinity(o.Bic[result.Candidates.ToList().IndexOf(result.TrueCandidate)])))
                {
                    context.Err.WriteLine("sizetest: no mock could be fitted with the true model; the numbers are meaningless");
                    return ExitCodes.AnalysisFailed;
                }
                return ExitCodes.Success;
            }
            catch (Exception ex)
            {
                folder?.Abandon();
                return context.Fail(ex);
            }
        });
        return command;
    }

    private static int[] ParseSizes(string text)
    {
        var list = new List<int>();
        foreach (var item in text.Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
        {
            if (!int.TryParse(item, NumberStyles.Integer, Inv, out int n) || n < 10)
                throw new InputException($"--n: '{item}' is not a sample size of at least 10; write e.g. --n 250,500,1000,2000");
            list.Add(n);
        }
        if (list.Count == 0) throw new InputException("--n needs at least one sample size, e.g. --n 250,500,1000,2000");
        return list.ToArray();
    }

    private static void WriteTable(TextWriter o, PowerResult r)
    {
        o.WriteLine(FormattableString.Invariant($"Power analysis (synthetic mocks): true model {r.TrueCandidate}, candidates {string.Join(", ", r.Candidates)}; {r.Mocks} mocks per N; observable {r.Observable.Name()}; z {r.ZDist}; seed {r.Seed}."));
        var header = new[] { "N", "P(best)", "P(dBIC>6)", "P(dBIC>10)", "dBIC q16", "q50", "q84", "a bias", "a spread", "a cover", "verdict" };
        var rows = new List<string[]> { header };
        var perGroup = new List<string>();
        foreach (var p in r.Points)
        {
            // One size exponent per population (--population): the columns show the one worst recovered (largest |bias| / spread), named below.
            var a = p.Recovery.FirstOrDefault(x => x.Name == NuisanceParameters.Names.SizeEvolution)
                    ?? p.Recovery.Where(x => x.Name.StartsWith(NuisanceParameters.Names.SizeEvolution + "@", StringComparison.Ordinal))
                        .OrderByDescending(x => double.IsFinite(x.Spread) && x.Spread > 0 ? Math.Abs(x.Bias) / x.Spread : 0).FirstOrDefault();
            if (a is not null && a.Name != NuisanceParameters.Names.SizeEvolution) perGroup.Add(FormattableString.Invariant($"N = {p.SampleSize}: {a.Name}"));
            rows.Add([
                p.SampleSize.ToString(Inv), p.ProbabilityTrueBest.ToString("F2", Inv), p.ProbabilityStrong.ToString("F2", Inv), p.ProbabilityDecisive.ToString("F2", Inv),
                F(p.DeltaBicQuantiles[1], "F2"), F(p.DeltaBicQuantiles[2], "F2"), F(p.DeltaBicQuantiles[3], "F2"),
                a is null ? "" : F(a.Bias, "F3"), a is null ? "" : F(a.Spread, "F3"), a is null ? "" : a.Coverage.ToString("F2", Inv), p.Verdict,
            ]);
        }
        int[] w = Enumerable.Range(0, header.Length).Select(c => rows.Max(x => x[c].Length)).ToArray();
        foreach (var row in rows) o.WriteLine(string.Join("  ", row.Select((x, c) => c == row.Length - 1 ? x : x.PadLeft(w[c]))).TrimEnd());
        if (perGroup.Count > 0) o.WriteLine("a columns: the population whose exponent is recovered worst (" + string.Join("; ", perGroup) + ").");
        o.WriteLine("Conclusion: " + r.Conclusion + ".");
    }

    // Fixed decimals per column (ΔBIC to 0.01, the exponent's bias and spread to 0.001), so a column reads as one scale.
    private static string F(double v, string format) => double.IsFinite(v) ? v.ToString(format, Inv) : "";
}

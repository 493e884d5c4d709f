using System.CommandLine;
using SizeTest.Catalogues;
using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Files;
using SizeTest.Simulation;

namespace SizeTest.Cli;

/// <summary>
/// <c>sizetest simulate</c>: draws a synthetic catalogue from a world model, a population and a survey design
/// and writes it (CSV, FITS or VOTable by the extension of <c>--out</c>) with <c>FILE.truth.json</c>.
/// Columns are named by role (<c>id, z, [z_err], theta, theta_err, mu, mu_err, mag</c>), so <c>fit</c> reads the
/// file with no mapping.
/// </summary>
internal static class SimulateCommand
{
    public static Command Create(CliContext context)
    {
        var command = new Command("simulate", "Draw a synthetic (mock) catalogue of galaxies or compact radio sources from a world model and a survey design; writes the catalogue and FILE.truth.json.");
        var models = new WorldModelOptions();
        var survey = new MockSurveyOptions("Objects in the catalogue (after selection; drawing continues until this many pass).");
        var seed = new Option<long?>("--seed") { Description = "Seed of every random draw (required: the same seed gives the same catalogue bit for bit)." };
        var output = new Option<string?>("--out") { Description = "Catalogue file: .csv, .fits (.fit, .fts), .vot (.votable, .xml) or .parquet. The truth goes to FILE.truth.json." };
        var force = new Option<bool>("--force") { Description = "Replace existing output files." };
        var maxMemory = new Option<string?>("--max-memory") { Description = "Refuse a catalogue whose estimated memory (about 240 bytes per object) is above this size (e.g. 4G); the machine's available memory is always a limit." };
        models.AddTo(command);
        survey.AddTo(command);
        command.Options.Add(seed);
        command.Options.Add(output);
        command.Options.Add(force);
        command.Options.Add(maxMemory);
        context.SetAction(command, parse =>
        {
            int n = parse.GetValue(survey.Count) ?? throw new InputException("--n is required: the number of objects in the catalogue, e.g. --n 2000");
            long s = parse.GetValue(seed) ?? throw new InputException("--seed is required so that the catalogue can be reproduced, e.g. --seed 1");
            string outPath = parse.GetValue(output) ?? throw new InputException("--out is required: the catalogue file, e.g. --out mock.csv");
            var format = FormatOf(outPath);
            if (n < 1) throw new InputException($"--n must be at least 1; got {n}");
            long? limit = parse.GetValue(maxMemory) is { } mm ? ResourceBudget.ParseSize(mm) : null;
            // About 240 bytes per object: the mock's columns plus the table written from them (measured in issue 14).
            ResourceBudget.Check($"a catalogue of {n} objects (--n)", 240.0 * n, limit);
            string truthPath = outPath + ".truth.json";
            bool replace = parse.GetValue(force);
            foreach (var p in new[] { outPath, truthPath })
                if (File.Exists(p) && !replace)
                    throw new InputException("already exists; pass --force to replace it or choose another --out", p);
            var model = models.Create(parse);
            var design = survey.Design(parse, n);
            var spec = new MockSurveySpec(model, design, s, survey.Galaxies(parse), survey.Radio(parse), survey.Survey(parse));
            var catalogue = MockSurveyGenerator.Generate(spec);
            Write(catalogue, outPath, format);
            AtomicFile.WriteAllText(truthPath, MockTruthJson.Serialize(catalogue, Path.GetFileName(outPath), CommandText(parse)));
            context.Out.WriteLine(FormattableString.Invariant(
                $"Wrote {catalogue.Count} synthetic {(design.Kind == MockObjectKind.Galaxy ? "galaxies" : "radio sources")} to {outPath} ({(format == CatalogueFormat.Text ? "csv" : format.ToString().ToLowerInvariant())}; drawn {catalogue.Drawn}, pass fraction {catalogue.PassFraction:G4}) and the truth to {truthPath}."));
            return ExitCodes.Success;
        });
        return command;
    }

    /// <summary>The command line as given (tokens after the verb), for the truth record.</summary>
    private static string CommandText(ParseResult parse) =>
        "sizetest simulate " + string.Join(' ', parse.Tokens.Skip(1).Select(t => t.Value.Contains(' ') ? $"\"{t.Value}\"" : t.Value));

    private static CatalogueFormat FormatOf(string path) => CatalogueWriters.FormatOf(path)
        ?? throw new InputException("--out must end in .csv, .fits (.fit, .fts), .vot (.votable, .xml) or .parquet to choose the format", path);

    /// <summary>Writes the mock: angles in arcsec (the default unit), radio sizes in mas where the format carries units (FITS, VOTable).</summary>
    private static void Write(MockCatalogue catalogue, string path, CatalogueFormat format)
    {
        bool radio = catalogue.Spec.Design.Kind == MockObjectKind.CompactRadio;
        string name = radio ? "MOCK_RADIO" : "MOCK_GALAXIES";
        bool unitsInFile = format is CatalogueFormat.Fits or CatalogueFormat.VoTable;
        CatalogueWriters.Write(path, format, catalogue.ToTable(name, thetaInMas: radio && unitsInFile),
            "Synthetic mock catalogue drawn by SizeTest (not an observation); truth in the .truth.json file beside it.");
    }
}

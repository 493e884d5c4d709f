using System.CommandLine;
using System.Globalization;
using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Files;
using SizeTest.Studies;

namespace SizeTest.Cli;

/// <summary>
/// <c>sizetest run STUDY.toml [--out DIR] [--force]</c> runs a whole study from its study file;
/// <c>sizetest demo [--out DIR] [--force]</c> runs the shipped demo study (demo-catalogs/demo-study.toml) into reports/demo/.
/// Exit 0 on success, 1 when a fit did not converge (the report is still written), 2 on bad input.
/// </summary>
internal static class StudyCommands
{
    /// <summary>The shipped demo study, relative to the repository root.</summary>
    public const string DemoStudy = "demo-catalogs/demo-study.toml";

    public static Command Run(CliContext context)
    {
        var study = new Argument<string>("STUDY") { Description = "Study file (TOML): catalogue, columns, corrections, models, priors, selection, inference and report settings." };
        var output = new Option<string?>("--out") { Description = "Output folder (default: reports/<study name>/)." };
        var limits = new OutputLimitOptions("Replace the output folder if it exists.", "a study whose estimated memory (chains, resamples, starts)");
        var cmd = new Command("run", "Run a whole study from a study file: load, correct, fit, compare, and write the report folder.");
        cmd.Arguments.Add(study);
        cmd.Options.Add(output);
        cmd.Options.Add(limits.Force);
        cmd.Options.Add(limits.MaxMemory);
        context.SetAction(cmd, parse =>
        {
            var def = StudyFileParser.Load(parse.GetValue(study)!);
            return Execute(context, def, parse.GetValue(output) ?? Path.Combine("reports", def.Name), limits.Replace(parse), "run", limits.MemoryLimit(parse));
        });
        return cmd;
    }

    public static Command Demo(CliContext context)
    {
        var output = new Option<string?>("--out") { Description = "Output folder (default: reports/demo/ beside demo-catalogs/)." };
        var force = new Option<bool>("--force") { Description = "Replace the output folder if it exists." };
        var cmd = new Command("demo", $"Run the shipped demo study ({DemoStudy}, synthetic Quillon Deep Field catalogue) and write its report to reports/demo/.");
        cmd.Options.Add(output);
        cmd.Options.Add(force);
        context.SetAction(cmd, parse =>
        {
            var root = FindRoot() ?? throw new InputException($"cannot find {DemoStudy} in this folder or any folder above it; run the demo from the SizeTest repository");
            var path = Path.GetRelativePath(Directory.GetCurrentDirectory(), Path.Combine(root, DemoStudy));
            var def = StudyFileParser.Load(path);
            var outDir = parse.GetValue(output) ?? Path.GetRelativePath(Directory.GetCurrentDirectory(), Path.Combine(root, "reports", "demo"));
            return Execute(context, def, outDir, parse.GetValue(force), "demo");
        });
        return cmd;
    }

    private static string? FindRoot()
    {
        for (var d = new DirectoryInfo(Directory.GetCurrentDirectory()); d is not null; d = d.Parent)
            if (File.Exists(Path.Combine(d.FullName, DemoStudy))) return d.FullName;
        return null;
    }

    private static int Execute(CliContext context, StudyDefinition def, string outDir, bool force, string verb, long? maxMemoryBytes = null)
    {
        var outcome = StudyRunner.Run(def, new StudyRunOptions
        {
            OutputDirectory = outDir,
            Force = force,
            MaxMemoryBytes = maxMemoryBytes,
            Version = BuildInfo.Version,
            GitCommit = BuildInfo.Commit,
            Command = "sizetest " + string.Join(' ', Environment.GetCommandLineArgs().Skip(1).Select(a => a.Contains(' ', StringComparison.Ordinal) ? $"\"{a}\"" : a)),
            Log = line => context.Err.WriteLine($"sizetest {verb}: {line}"),
            FitProgress = new FitProgressReporter(context),
        });
        var r = outcome.Result;
        context.Out.Write($"{def.Name}: ");
        FitTables.WriteTable(context.Out, r);
        context.Out.WriteLine($"report: {Path.Combine(outDir, "report.html")}");
        if (!r.AllConverged)
        {
            context.Err.WriteLine($"sizetest: a fit did not converge ({string.Join("; ", r.Models.Where(m => !m.Converged).Select(m => $"{m.Name}: {m.ExitReason}"))}); the report was written to {outDir} but is not reliable");
            return ExitCodes.AnalysisFailed;
        }
        return ExitCodes.Success;
    }
}

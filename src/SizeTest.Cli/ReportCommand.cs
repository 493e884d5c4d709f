using System.CommandLine;
using SizeTest.Reporting;
using SizeTest.Reporting.Pack;
using SizeTest.Reporting.Pdf;

namespace SizeTest.Cli;

/// <summary><c>sizetest report DIR [--out OUT] [--paper a4|letter] [--force]</c>: redraws a report from its saved data without refitting.</summary>
internal static class ReportCommand
{
    public static Command Create(CliContext context)
    {
        var dir = new Argument<string>("DIR") { Description = "Report folder written by 'sizetest run' (holds report-data.json)." };
        var output = new Option<string?>("--out") { Description = "Write the redrawn report to this folder instead of redrawing DIR in place." };
        var force = new Option<bool>("--force") { Description = "Replace --out if it exists and is not empty." };
        var paper = new Option<string>("--paper")
        {
            Description = "Paper size of report.pdf: a4 (default) or letter.",
            DefaultValueFactory = _ => "a4",
        }.AcceptOnlyFromAmong("a4", "letter");
        var cmd = new Command("report", "Redraw a report (figures, tables, HTML, PDF, manifest) from its saved results, without refitting.");
        cmd.Arguments.Add(dir);
        cmd.Options.Add(output);
        cmd.Options.Add(force);
        cmd.Options.Add(paper);
        context.SetAction(cmd, parse =>
        {
            PaperSize.TryParse(parse.GetValue(paper), out var size);
            var src = parse.GetValue(dir)!;
            context.Err.WriteLine($"sizetest: redrawing the report from {Path.Combine(src, Reporting.Data.ReportDataJson.FileName)}");
            var (target, files) = ReportRedraw.Run(src, parse.GetValue(output), parse.GetValue(force), new ReportPackOptions { Paper = size });
            context.Out.WriteLine($"wrote {files.Count} report files to {target} (report.html, report.pdf, figures/, tables/, manifest.json)");
            return ExitCodes.Success;
        });
        return cmd;
    }
}

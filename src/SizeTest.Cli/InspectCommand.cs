using System.CommandLine;
using System.Globalization;
using SizeTest.Catalogues;
using SizeTest.Foundation.Errors;
using SizeTest.Photometry;

namespace SizeTest.Cli;

/// <summary>
/// <c>sizetest inspect CATALOG</c>: what SizeTest sees in a catalogue — format and table, the
/// columns with type/unit/UCD, the column mapping and why, row counts with the main reject
/// reasons, and per-role statistics. Optionally writes the reject log.
/// </summary>
internal static class InspectCommand
{
    public static Command Create(CliContext context)
    {
        var catalogue = new Argument<string>("catalog") { Description = "The catalogue file (CSV/TSV/text, FITS binary table or VOTable)." };
        var cat = new CatalogueOptions();
        var phot = new PhotometryCliOptions();
        var format = CliOptions.Format();
        var rejectLog = new Option<string?>("--reject-log") { Description = "Write the rejected rows (row,column,value,reason,detail) to this CSV file." };
        var force = new Option<bool>("--force") { Description = "Replace an existing reject log." };
        var cmd = new Command("inspect", "Show how a catalogue is read: format, columns, column mapping, accepted and rejected rows, per-role statistics.");
        cmd.Arguments.Add(catalogue);
        cat.AddTo(cmd);
        phot.AddTo(cmd);
        cmd.Options.Add(format);
        cmd.Options.Add(rejectLog);
        cmd.Options.Add(force);
        context.SetAction(cmd, parse =>
        {
            var path = parse.GetValue(catalogue)!;
            var logPath = parse.GetValue(rejectLog);
            bool overwrite = parse.GetValue(force);
            if (logPath is not null)
            {
                // Nothing the user gave is replaced, not even with --force: the catalogue being read is never the reject log.
                if (SizeTest.Foundation.Files.FilePaths.SameFile(logPath, path))
                    throw new InputException($"reject log '{logPath}' is the catalogue being read; choose another path (--force never replaces an input)");
                if (Directory.Exists(logPath))
                    throw new InputException($"reject log '{logPath}' is a folder; name a file, e.g. --reject-log {Path.Combine(logPath, "rejects.csv")}");
                if (File.Exists(logPath) && !overwrite)
                    throw new InputException($"reject log '{logPath}' already exists; pass --force to replace it or choose another path");
            }
            var options = cat.ToLoadOptions(parse) with { Progress = n => Progress(context, n) };
            var photText = phot.ToText(parse);
            var photometry = phot.ToOptions(parse);
            var load = CatalogueLoader.Load(path, options);
            var corrections = Corrections(load, photometry, photText);
            if (context.IsInteractive && load.RowsRead >= 1_000_000) context.Err.WriteLine();
            if (logPath is not null) load.RejectLog.WriteCsv(logPath, overwrite);
            switch (parse.GetValue(format))
            {
                case "json": context.Out.WriteLine(CatalogueInspectionJson.Write(path, load, corrections, SettingFlags.Flag)); break;
                case "csv": WriteCsv(context.Out, load); break;
                default: WriteTable(context.Out, path, load, logPath, corrections); break;
            }
            return ExitCodes.Success;
        });
        return cmd;
    }

    // The corrections the photometry stage will apply (what fit uses). Without photometry options a catalogue the
    // stage cannot handle (e.g. isophotal sizes without --sersic-n) is still inspected, and the problem is listed;
    // with options given, the problem is an input error.
    private static IReadOnlyList<string> Corrections(CatalogueLoad load, PhotometryOptions photometry, PhotometryOptionText given)
    {
        if (load.Accepted == 0) return ["none: no accepted rows"];
        try
        {
            return ObservablesBuilder.Build(load.Rows, photometry).Corrections;
        }
        catch (InputException ex) when (given == new PhotometryOptionText())
        {
            return ["cannot be applied as given: " + SettingProblem.Literal(SettingFlags.Message(ex))]; // already spelled: kept literal
        }
    }

    private static void Progress(CliContext context, long rows)
    {
        if (rows < 1_000_000) return;
        if (context.IsInteractive) context.Err.Write($"\rsizetest: read {rows:N0} rows");
        else context.Err.WriteLine($"sizetest: read {rows.ToString(CultureInfo.InvariantCulture)} rows");
    }

    private static string F(double v) => double.IsNaN(v) ? "" : v.ToString("G6", CultureInfo.InvariantCulture);

    private static string FormatName(CatalogueLoad load) => load.Format switch
    {
        CatalogueFormat.Fits => "FITS binary table",
        CatalogueFormat.VoTable => "VOTable",
        CatalogueFormat.Parquet => "Parquet",
        _ when load.LayoutNotes.Count > 0 && load.LayoutNotes[0].StartsWith("layout: IPAC table", StringComparison.Ordinal) => "IPAC table (column-aligned text)",
        _ => "delimited text",
    };

    private static void WriteTable(TextWriter raw, string path, CatalogueLoad load, string? logPath, IReadOnlyList<string> corrections)
    {
        var o = new EscapingWriter(raw); // names, units and cells come from the user's file
        o.WriteLine($"catalogue: {path}");
        o.WriteLine($"format:    {FormatName(load)}{(load.Table is null ? "" : $", {load.Table}")}");
        foreach (var n in load.LayoutNotes) o.WriteLine($"           {n}");
        o.WriteLine();
        o.WriteLine($"columns ({load.Columns.Count}):");
        var rows = load.Columns.Select(c => new[] { c.Name, c.Kind.ToString().ToLowerInvariant(), c.NativeType, c.Unit ?? "", c.Ucd ?? "", c.Description ?? "" }).ToList();
        WriteGrid(o, ["name", "type", "stored as", "unit", "UCD", "description"], rows);
        o.WriteLine();
        o.WriteLine("mapping:");
        foreach (var line in load.DetectionReport) o.WriteLine($"  {SettingFlags.Text(line)}");
        o.WriteLine();
        o.WriteLine($"rows: {load.RowsRead} read, {load.Accepted} accepted, {load.Rejected} rejected");
        foreach (var (reason, count) in load.RejectLog.CountsByReason().Take(5))
        {
            var example = load.RejectLog.Entries.First(e => e.Reason == reason);
            o.WriteLine($"  {count,8} {reason.Code()} (first: row {example.Row}{(example.Column.Length > 0 ? $", column '{example.Column}'" : "")}{(example.Detail.Length > 0 ? $", {example.Detail}" : "")})");
        }
        if (logPath is not null) o.WriteLine($"  reject log written to {logPath}");
        else if (load.Rejected > 0) o.WriteLine("  (write them all with --reject-log PATH)");
        o.WriteLine();
        o.WriteLine("accepted rows by role:");
        var stats = load.Statistics().Select(s => new[]
        {
            s.Role.Name(), s.Column, s.Unit, s.Count.ToString(CultureInfo.InvariantCulture), s.NullCount.ToString(CultureInfo.InvariantCulture),
            F(s.Min), F(s.Median), F(s.Max),
        }).ToList();
        WriteGrid(o, ["role", "column", "unit", "count", "nulls", "min", "median", "max"], stats);
        o.WriteLine();
        o.WriteLine("corrections that will be applied:");
        foreach (var c in corrections) o.WriteLine($"  {SettingFlags.Text(c)}");
    }

    private static void WriteGrid(TextWriter o, string[] header, List<string[]> rows)
    {
        var widths = header.Select((h, i) => Math.Min(40, Math.Max(h.Length, rows.Count == 0 ? 0 : rows.Max(r => r[i].Length)))).ToArray();
        string Line(string[] cells) => "  " + string.Join("  ", cells.Select((c, i) => (c.Length > widths[i] ? c[..(widths[i] - 1)] + "…" : c).PadRight(widths[i]))).TrimEnd();
        o.WriteLine(Line(header));
        foreach (var r in rows) o.WriteLine(Line(r));
    }

    private static void WriteCsv(TextWriter o, CatalogueLoad load)
    {
        o.WriteLine("role,column,unit,count,null_count,min,median,max");
        foreach (var s in load.Statistics())
            o.WriteLine(string.Join(",", RejectLog.Quote(s.Role.Name()), RejectLog.Quote(s.Column), RejectLog.Quote(s.Unit),
                s.Count.ToString(CultureInfo.InvariantCulture), s.NullCount.ToString(CultureInfo.InvariantCulture),
                R(s.Min), R(s.Median), R(s.Max)));
    }

    private static string R(double v) => double.IsNaN(v) ? "" : v.ToString("R", CultureInfo.InvariantCulture);
}

using System.Text;
using System.Text.Json;
using SizeTest.Foundation.Errors;

namespace SizeTest.Catalogues;

/// <summary>
/// The contract of <c>sizetest inspect --format json</c> (docs/catalogues.md): one object with the keys <c>file, format,
/// table, layout, columns, mapping, size_definition, kept_columns, detection, rows_read, accepted, rejected,
/// reject_reasons, statistics, corrections</c>, in this order; a non-finite statistic is written as null. Built from a
/// <see cref="CatalogueLoad"/> as text, so the contract lives with the catalogue types and the CLI only prints it.
/// </summary>
public static class CatalogueInspectionJson
{
    /// <summary>The inspect JSON object (indented UTF-8 text, no trailing newline) for <paramref name="load"/> of the
    /// catalogue <paramref name="path"/>, with the photometric <paramref name="corrections"/> in words. The texts that name
    /// settings (a mapping's reason and unit source, the detection lines, the corrections) have each setting written by
    /// <paramref name="spell"/> (<see cref="SettingProblem.RenderText"/>); names and values from the file are written as they are.</summary>
    public static string Write(string path, CatalogueLoad load, IReadOnlyList<string> corrections, Func<string, string> spell)
    {
        ArgumentNullException.ThrowIfNull(load);
        ArgumentNullException.ThrowIfNull(corrections);
        ArgumentNullException.ThrowIfNull(spell);
        string Text(string template) => SettingProblem.RenderText(template, spell);
        using var ms = new MemoryStream();
        using (var w = new Utf8JsonWriter(ms, new JsonWriterOptions { Indented = true }))
        {
            void Num(string name, double v) { if (double.IsFinite(v)) w.WriteNumber(name, v); else w.WriteNull(name); }
            w.WriteStartObject();
            w.WriteString("file", path);
            w.WriteString("format", load.Format switch { CatalogueFormat.Fits => "fits", CatalogueFormat.VoTable => "votable", CatalogueFormat.Parquet => "parquet", _ => "text" });
            if (load.Table is null) w.WriteNull("table"); else w.WriteString("table", load.Table);
            w.WriteStartArray("layout");
            foreach (var n in load.LayoutNotes) w.WriteStringValue(n);
            w.WriteEndArray();
            w.WriteStartArray("columns");
            foreach (var c in load.Columns)
            {
                w.WriteStartObject();
                w.WriteString("name", c.Name);
                w.WriteString("type", c.Kind.ToString().ToLowerInvariant());
                w.WriteString("stored_as", c.NativeType);
                if (c.Unit is null) w.WriteNull("unit"); else w.WriteString("unit", c.Unit);
                if (c.Ucd is null) w.WriteNull("ucd"); else w.WriteString("ucd", c.Ucd);
                if (c.Description is null) w.WriteNull("description"); else w.WriteString("description", c.Description);
                w.WriteEndObject();
            }
            w.WriteEndArray();
            w.WriteStartArray("mapping");
            foreach (var role in ColumnRoles.All)
            {
                if (!load.Mapping.Roles.TryGetValue(role, out var b)) continue;
                w.WriteStartObject();
                w.WriteString("role", role.Name());
                w.WriteString("column", b.ColumnName);
                w.WriteString("unit", b.Unit);
                w.WriteString("unit_source", Text(b.UnitReason));
                w.WriteBoolean("relative", b.IsRelative);
                w.WriteString("reason", Text(b.Reason));
                w.WriteEndObject();
            }
            w.WriteEndArray();
            w.WriteString("size_definition", SizeDefinitions.Format(load.Mapping.SizeDefinition));
            w.WriteStartArray("kept_columns");
            foreach (var (name, _) in load.Mapping.Kept) w.WriteStringValue(name);
            w.WriteEndArray();
            w.WriteStartArray("detection");
            foreach (var line in load.DetectionReport) w.WriteStringValue(Text(line));
            w.WriteEndArray();
            w.WriteNumber("rows_read", load.RowsRead);
            w.WriteNumber("accepted", load.Accepted);
            w.WriteNumber("rejected", load.Rejected);
            w.WriteStartObject("reject_reasons");
            foreach (var (reason, count) in load.RejectLog.CountsByReason()) w.WriteNumber(reason.Code(), count);
            w.WriteEndObject();
            w.WriteStartArray("statistics");
            foreach (var s in load.Statistics())
            {
                w.WriteStartObject();
                w.WriteString("role", s.Role.Name());
                w.WriteString("column", s.Column);
                w.WriteString("unit", s.Unit);
                w.WriteNumber("count", s.Count);
                w.WriteNumber("null_count", s.NullCount);
                Num("min", s.Min);
                Num("median", s.Median);
                Num("max", s.Max);
                w.WriteEndObject();
            }
            w.WriteEndArray();
            w.WriteStartArray("corrections");
            foreach (var c in corrections) w.WriteStringValue(Text(c));
            w.WriteEndArray();
            w.WriteEndObject();
        }
        return Encoding.UTF8.GetString(ms.ToArray());
    }
}

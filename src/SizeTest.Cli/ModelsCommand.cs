using System.CommandLine;
using System.Globalization;
using System.Text;
using System.Text.Json;
using SizeTest.Cosmology;

namespace SizeTest.Cli;

/// <summary><c>sizetest models</c>: every world model with its parameters, defaults, units, ranges and dimming law.</summary>
internal static class ModelsCommand
{
    public static Command Create(CliContext context)
    {
        var command = new Command("models", "List the world models with their parameters (option, default, unit, range) and the surface-brightness dimming law each implies.");
        var format = CliOptions.Format();
        command.Options.Add(format);
        context.SetAction(command, parse =>
        {
            switch (parse.GetValue(format))
            {
                case "json": WriteJson(context.Out); break;
                case "csv": WriteCsv(context.Out); break;
                default: WriteTable(context.Out); break;
            }
            return ExitCodes.Success;
        });
        return command;
    }

    private static string Num(double v) => v.ToString("G", CultureInfo.InvariantCulture);

    private static string DefaultText(ParameterSpec p) => p.DefaultIsDerived
        ? p.Name == WorldModelParameters.OmegaLambda.Name ? "flat" : "derived"
        : Num(p.Default);

    private static void WriteTable(TextWriter o)
    {
        foreach (var f in WorldModels.All)
        {
            o.WriteLine($"{f.Name} ({(f.IsExpanding ? "expanding FLRW" : "static Euclidean")})");
            o.WriteLine($"  {f.Description}");
            o.WriteLine($"  dimming: {f.DimmingLaw}");
            int w = f.Parameters.Max(p => WorldModelOptions.OptionName(p.Name).Length);
            foreach (var p in f.Parameters)
            {
                string unit = p.Unit.Length > 0 ? " " + p.Unit : "";
                o.WriteLine($"  {WorldModelOptions.OptionName(p.Name).PadRight(w)}  default {DefaultText(p)}{unit}, range [{Num(p.Min)}, {Num(p.Max)}]: {p.Description}");
            }
            o.WriteLine();
        }
    }

    private static string Csv(string s) => s.IndexOfAny([',', '"', '\n']) >= 0 ? "\"" + s.Replace("\"", "\"\"") + "\"" : s;

    private static void WriteCsv(TextWriter o)
    {
        o.WriteLine("model,kind,dimming_law,parameter,option,symbol,unit,default,min,max,description");
        foreach (var f in WorldModels.All)
            foreach (var p in f.Parameters)
                o.WriteLine(string.Join(',', new[]
                {
                    f.Name, f.IsExpanding ? "expanding" : "static", f.DimmingLaw, p.Name, WorldModelOptions.OptionName(p.Name),
                    p.Symbol, p.Unit, DefaultText(p), Num(p.Min), Num(p.Max), p.Description,
                }.Select(Csv)));
    }

    private static void WriteJson(TextWriter o)
    {
        using var stream = new MemoryStream();
        using (var json = new Utf8JsonWriter(stream, new JsonWriterOptions { Indented = true }))
        {
            json.WriteStartArray();
            foreach (var f in WorldModels.All)
            {
                json.WriteStartObject();
                json.WriteString("name", f.Name);
                json.WriteBoolean("expanding", f.IsExpanding);
                json.WriteString("description", f.Description);
                json.WriteString("dimming_law", f.DimmingLaw);
                json.WriteStartArray("parameters");
                foreach (var p in f.Parameters)
                {
                    json.WriteStartObject();
                    json.WriteString("name", p.Name);
                    json.WriteString("option", WorldModelOptions.OptionName(p.Name));
                    json.WriteString("symbol", p.Symbol);
                    json.WriteString("unit", p.Unit);
                    if (p.DefaultIsDerived) json.WriteNull("default"); else json.WriteNumber("default", p.Default);
                    json.WriteString("default_text", DefaultText(p));
                    json.WriteNumber("min", p.Min);
                    json.WriteNumber("max", p.Max);
                    json.WriteString("description", p.Description);
                    json.WriteEndObject();
                }
                json.WriteEndArray();
                json.WriteEndObject();
            }
            json.WriteEndArray();
        }
        o.WriteLine(Encoding.UTF8.GetString(stream.ToArray()));
    }
}

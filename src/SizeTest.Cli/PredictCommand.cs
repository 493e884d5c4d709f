using System.CommandLine;
using System.Globalization;
using System.Text;
using System.Text.Json;
using SizeTest.Foundation.Errors;
using SizeTest.Cosmology;

namespace SizeTest.Cli;

/// <summary>
/// <c>sizetest predict</c>: distances, lookback time, angular size of a proper size and
/// Tolman dimming of one world model at a list of redshifts. Columns (docs/world-models.md):
/// <c>z, comoving_mpc, transverse_comoving_mpc, angular_diameter_mpc, luminosity_mpc,
/// lookback_gyr, theta_arcsec, dimming_mag</c>; a quantity the model does not define (and θ at
/// z = 0, which is infinite) is empty (null in JSON).
/// </summary>
internal static class PredictCommand
{
    /// <summary>The output columns, in order.</summary>
    public static readonly string[] Columns =
        ["z", "comoving_mpc", "transverse_comoving_mpc", "angular_diameter_mpc", "luminosity_mpc", "lookback_gyr", "theta_arcsec", "dimming_mag"];

    public static Command Create(CliContext context)
    {
        var command = new Command("predict", "Print distances, lookback time, angular size and Tolman dimming of a world model at given redshifts.");
        var models = new WorldModelOptions();
        var z = new Option<string>("--z")
        {
            Description = "Redshifts: a list 0.1,0.5,1 or a range start:stop:step such as 0.1:3:0.1 (items may be mixed).",
            DefaultValueFactory = _ => "0.1,0.5,1,1.5,2,3,5",
        };
        var size = new Option<double?>("--size-kpc")
        {
            Description = "Proper (physical) size in kpc whose angular size theta_arcsec is printed (default 1).",
            CustomParser = WorldModelOptions.NumberParser,
        };
        var format = CliOptions.Format();
        models.AddTo(command);
        command.Options.Add(z);
        command.Options.Add(size);
        command.Options.Add(format);
        context.SetAction(command, parse =>
        {
            double sizeKpc = parse.GetValue(size) ?? 1.0;
            if (!(sizeKpc > 0) || !double.IsFinite(sizeKpc))
                throw new InputException($"--size-kpc must be a positive number of kpc; got {sizeKpc.ToString(CultureInfo.InvariantCulture)}.");
            double[] redshifts = RedshiftList.Parse(parse.GetValue(z) ?? "");
            var model = models.Create(parse);
            var rows = Compute(model, redshifts, sizeKpc);
            Write(context.Out, parse.GetValue(format) ?? "table", model, sizeKpc, rows);
            return ExitCodes.Success;
        });
        return command;
    }

    /// <summary>Computes the rows; NaN marks an empty cell. Invalid redshifts throw <see cref="InputException"/>.</summary>
    internal static double[][] Compute(IWorldModel model, double[] redshifts, double sizeKpc)
    {
        var rows = new double[redshifts.Length][];
        for (int i = 0; i < redshifts.Length; i++)
        {
            double zi = redshifts[i];
            bool ok = model.IsExpanding ? zi >= 0 && zi <= FlrwModel.MaxRedshift : zi > 0 && zi <= FlrwModel.MaxRedshift;
            if (!ok)
                throw new InputException(model.IsExpanding
                    ? string.Create(CultureInfo.InvariantCulture, $"--z: redshift {zi} is outside [0, {FlrwModel.MaxRedshift:G}] accepted by world model '{model.Name}'.")
                    : string.Create(CultureInfo.InvariantCulture, $"--z: redshift {zi} is not allowed for the static world model '{model.Name}', which needs 0 < z ≤ {FlrwModel.MaxRedshift:G} (at z = 0 the source sits at the observer)."));
            double Get(DistanceQuantity q, Func<double, double> f) => model.Defines(q) ? f(zi) : double.NaN;
            double da = model.AngularDiameterDistance(zi);
            double theta = da > 0 ? model.AngularSizeArcsec(zi, sizeKpc) : double.NaN;
            rows[i] =
            [
                zi,
                Get(DistanceQuantity.Comoving, model.ComovingDistance),
                Get(DistanceQuantity.TransverseComoving, model.TransverseComovingDistance),
                Get(DistanceQuantity.AngularDiameter, _ => da),
                Get(DistanceQuantity.Luminosity, model.LuminosityDistance),
                Get(DistanceQuantity.LookbackTime, model.LookbackTime),
                theta,
                model.TolmanDimmingMagnitudes(zi),
            ];
        }
        return rows;
    }

    private static void Write(TextWriter output, string format, IWorldModel model, double sizeKpc, double[][] rows)
    {
        switch (format)
        {
            case "csv":
                output.WriteLine(string.Join(',', Columns));
                foreach (var row in rows) output.WriteLine(string.Join(',', row.Select(Machine)));
                break;
            case "json":
                WriteJson(output, model, sizeKpc, rows);
                break;
            default:
                WriteTable(output, model, sizeKpc, rows);
                break;
        }
    }

    private static string Machine(double v) => double.IsFinite(v) ? v.ToString("R", CultureInfo.InvariantCulture) : "";

    private static void WriteJson(TextWriter output, IWorldModel model, double sizeKpc, double[][] rows)
    {
        using var stream = new MemoryStream();
        using (var json = new Utf8JsonWriter(stream, new JsonWriterOptions { Indented = true }))
        {
            json.WriteStartObject();
            json.WriteString("model", model.Name);
            json.WriteBoolean("expanding", model.IsExpanding);
            json.WriteStartObject("parameters");
            foreach (var (name, value) in model.ParameterValues) json.WriteNumber(name, value);
            json.WriteEndObject();
            json.WriteNumber("size_kpc", sizeKpc);
            json.WriteNumber(WorldModelParameters.Names.DimmingExponent, model.BolometricDimmingExponent);
            if (model is FlrwModel flrw && double.IsFinite(flrw.AgeGyr)) json.WriteNumber("age_gyr", flrw.AgeGyr);
            else json.WriteNull("age_gyr");
            json.WriteStartArray("rows");
            foreach (var row in rows)
            {
                json.WriteStartObject();
                for (int c = 0; c < Columns.Length; c++)
                {
                    if (double.IsFinite(row[c])) json.WriteNumber(Columns[c], row[c]);
                    else json.WriteNull(Columns[c]);
                }
                json.WriteEndObject();
            }
            json.WriteEndArray();
            json.WriteEndObject();
        }
        output.WriteLine(Encoding.UTF8.GetString(stream.ToArray()));
    }

    private static void WriteTable(TextWriter output, IWorldModel model, double sizeKpc, double[][] rows)
    {
        string parameters = string.Join(", ", model.ParameterValues.Select(p => FormattableString.Invariant($"{p.Key} = {p.Value:G6}")));
        string age = model is FlrwModel flrw ? FormattableString.Invariant($"; age {flrw.AgeGyr:G6} Gyr") : "";
        output.WriteLine(FormattableString.Invariant($"World model {model.Name} ({parameters}){age}; theta for {sizeKpc:G6} kpc; dimming (1+z)^-{model.BolometricDimmingExponent:G4} in mag; empty = not defined."));
        var cells = new List<string[]> { Columns };
        foreach (var row in rows)
            cells.Add(row.Select((v, c) => double.IsFinite(v) ? v.ToString(c == 0 ? "G10" : "G7", CultureInfo.InvariantCulture) : "").ToArray());
        int[] widths = Enumerable.Range(0, Columns.Length).Select(c => cells.Max(r => r[c].Length)).ToArray();
        foreach (var line in cells)
            output.WriteLine(string.Join("  ", line.Select((s, c) => s.PadLeft(widths[c]))).TrimEnd());
    }
}

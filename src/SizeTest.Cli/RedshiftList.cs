using System.Globalization;
using SizeTest.Foundation.Errors;

namespace SizeTest.Cli;

/// <summary>
/// Parses the <c>--z</c> value: a comma-separated list of redshifts and/or ranges
/// <c>start:stop:step</c> (stop included when it falls on the grid, within 1e-9 of a step).
/// Ranges are stepped in decimal arithmetic so <c>0.1:3:0.1</c> gives 0.1, 0.2, 0.3, ... exactly
/// as written.
/// </summary>
internal static class RedshiftList
{
    /// <summary>Most redshifts one <c>--z</c> may produce.</summary>
    public const int MaxCount = 1_000_000;

    /// <summary>Parses <paramref name="text"/>; bad input throws <see cref="InputException"/> naming the option.</summary>
    public static double[] Parse(string text, string option = "--z")
    {
        if (string.IsNullOrWhiteSpace(text)) throw new InputException($"{option} needs redshifts, e.g. {option} 0.1,0.5,1 or {option} 0.1:3:0.1.");
        var values = new List<double>();
        foreach (string rawItem in text.Split(','))
        {
            string item = rawItem.Trim();
            if (item.Length == 0) throw new InputException($"{option} '{text}' has an empty item; separate redshifts with single commas.");
            string[] parts = item.Split(':');
            if (parts.Length == 1)
            {
                values.Add((double)Number(parts[0], option, item));
            }
            else if (parts.Length == 3)
            {
                decimal start = Number(parts[0], option, item), stop = Number(parts[1], option, item), step = Number(parts[2], option, item);
                if (!double.TryParse(parts[2].Trim(), NumberStyles.Float, CultureInfo.InvariantCulture, out double stepValue)) stepValue = (double)step;
                if (!(stepValue > 0)) throw new InputException($"{option} range '{item}' needs a positive step.");
                if (stop < start) throw new InputException($"{option} range '{item}' ends before it starts; write start:stop:step with stop ≥ start.");
                // Estimate the count in double first: a tiny step (1e-300 rounds to a decimal 0) or a huge ratio would
                // otherwise read as "not positive" or overflow decimal arithmetic.
                double estimate = ((double)stop - (double)start) / stepValue + 1;
                if (step == 0 && stop == start) step = 1; // one redshift, whatever the step
                if (step == 0 || !(estimate <= MaxCount))
                    throw new InputException($"{option} range '{item}': the step {parts[2].Trim()} gives too many redshifts (about {estimate.ToString("G3", CultureInfo.InvariantCulture)}); at most {MaxCount} are allowed, so use a step of at least {((double)(stop - start) / (MaxCount - 1)).ToString("G3", CultureInfo.InvariantCulture)}.");
                decimal count = Math.Floor((stop - start) / step + 1e-9m) + 1;
                if (count + values.Count > MaxCount) throw new InputException($"{option} range '{item}' gives {count} redshifts; at most {MaxCount} are allowed.");
                for (long k = 0; k < (long)count; k++) values.Add((double)(start + k * step));
            }
            else
            {
                throw new InputException($"{option} item '{item}' is neither a number nor a range start:stop:step.");
            }
            if (values.Count > MaxCount) throw new InputException($"{option} gives more than {MaxCount} redshifts.");
        }
        return values.ToArray();
    }

    private static decimal Number(string s, string option, string item)
    {
        s = s.Trim();
        if (decimal.TryParse(s, NumberStyles.Float, CultureInfo.InvariantCulture, out decimal d)) return d;
        throw new InputException($"{option} item '{item}': '{s}' is not a number (use a dot as decimal separator).");
    }
}

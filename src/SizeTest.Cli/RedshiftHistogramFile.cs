using System.Globalization;
using SizeTest.Foundation.Errors;
using SizeTest.Simulation;

namespace SizeTest.Cli;

/// <summary>
/// Reads a redshift histogram for <c>--z-dist hist:FILE</c>: one bin per line, <c>z_lo z_hi weight</c>
/// (separated by blanks, commas or tabs); lines starting with <c>#</c> and blank lines are skipped, and a first
/// line that is not numeric is taken as a header. Bins must be contiguous and increasing; weights are relative
/// numbers of objects (≥ 0).
/// </summary>
internal static class RedshiftHistogramFile
{
    public static RedshiftDistribution Read(string path)
    {
        if (string.IsNullOrWhiteSpace(path)) throw new InputException("--z-dist hist:FILE needs a file name after 'hist:'");
        if (!File.Exists(path)) throw new InputException("redshift histogram file not found; check the path after 'hist:'", path);
        var edges = new List<double>();
        var weights = new List<double>();
        int lineNo = 0;
        bool sawData = false;
        foreach (var raw in File.ReadLines(path))
        {
            lineNo++;
            var line = raw.Trim();
            if (line.Length == 0 || line.StartsWith('#')) continue;
            var parts = line.Split([' ', '\t', ','], StringSplitOptions.RemoveEmptyEntries);
            var v = new double[3];
            bool numeric = parts.Length == 3 && parts.Select((p, k) => double.TryParse(p, NumberStyles.Float, CultureInfo.InvariantCulture, out v[k])).All(ok => ok);
            if (!numeric)
            {
                if (!sawData && parts.Length == 3 && parts.All(p => !double.TryParse(p, NumberStyles.Float, CultureInfo.InvariantCulture, out _))) { sawData = true; continue; } // header
                throw new InputException("expected three numbers 'z_lo z_hi weight'", path, lineNo);
            }
            sawData = true;
            if (edges.Count == 0) edges.Add(v[0]);
            else if (Math.Abs(v[0] - edges[^1]) > 1e-12 * Math.Max(1, Math.Abs(v[0])))
                throw new InputException(FormattableString.Invariant($"bin starts at {v[0]} but the previous bin ended at {edges[^1]}; bins must be contiguous (give empty bins weight 0)"), path, lineNo);
            if (!(v[1] > v[0])) throw new InputException(FormattableString.Invariant($"z_hi {v[1]} must be above z_lo {v[0]}"), path, lineNo);
            if (!(v[2] >= 0) || !double.IsFinite(v[2])) throw new InputException(FormattableString.Invariant($"weight {v[2]} must be finite and ≥ 0"), path, lineNo);
            edges.Add(v[1]);
            weights.Add(v[2]);
        }
        if (weights.Count == 0) throw new InputException("the redshift histogram has no bins", path);
        try
        {
            return RedshiftDistribution.Histogram(edges, weights, "hist:" + Path.GetFileName(path));
        }
        catch (ArgumentException ex)
        {
            throw new InputException(ex.Message, path);
        }
    }
}

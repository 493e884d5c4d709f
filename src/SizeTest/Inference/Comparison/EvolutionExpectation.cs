using System.Globalization;
using SizeTest.Inference;

namespace SizeTest.Inference.Comparison;

/// <summary>
/// What the literature expects of one evolution parameter: the plausible range, the physically expected sign and a
/// wider "far" range beyond which a required value is called far outside. Rows come from the shipped table
/// <c>Inference/Comparison/evolution-expectations.txt</c> (sources in each row) or a study file's <c>[expected]</c>.
/// </summary>
/// <param name="Parameter"><c>size_evolution</c> or <c>sb_evolution</c>.</param>
/// <param name="Population">Which objects the expectation is for.</param>
/// <param name="Lo">Lower end of the plausible range.</param>
/// <param name="Hi">Upper end of the plausible range.</param>
/// <param name="ExpectedSign">+1 or −1: the sign physics gives (0: no sign expected).</param>
/// <param name="FarLo">Below this, far outside.</param>
/// <param name="FarHi">Above this, far outside.</param>
/// <param name="Source">Where the numbers come from.</param>
public sealed record EvolutionExpectation(string Parameter, string Population, double Lo, double Hi, int ExpectedSign, double FarLo, double FarHi, string Source)
{
    private static readonly Lazy<IReadOnlyList<EvolutionExpectation>> Table = new(Load);

    /// <summary>The citations alone (author, year, journal), without the quoted figures.</summary>
    public string ShortSource => string.Join("; ", Source.Split(';')
        .Select(s => System.Text.RegularExpressions.Regex.Replace(s, @"\s*\[[^\]]*(read|memory|practice)[^\]]*\]", "").Split(':')[0].Trim())
        .Where(s => s.Length > 0 && !s.StartsWith("stellar-population", StringComparison.Ordinal)));

    /// <summary>The shipped table.</summary>
    public static IReadOnlyList<EvolutionExpectation> Shipped => Table.Value;

    /// <summary>
    /// The expectations in force: the shipped rows with the plausible range replaced by the study's own range where it
    /// gives one (the far range is then one range width beyond each end, as in the shipped table; the sign is kept),
    /// plus any study range for a parameter the table does not have. <paramref name="sbAtFixedLuminosity"/>: the fit's surface
    /// brightness is conditional on each object's luminosity (a joint fit with a size relation, <c>sb_luminosity_slope</c>), so b is the
    /// SB change at fixed luminosity (−2a when μ and L come from one photometry), not the luminosity evolution the shipped
    /// <c>sb_evolution</c> row describes: that row is left out (a study's own range still applies). <paramref name="compactRadioSources"/>:
    /// the shipped rows describe galaxies (effective radii, early-type luminosity evolution), not the parsec-scale structure of compact radio
    /// sources, so none of them applies; only the study's own ranges are in force.
    /// </summary>
    public static IReadOnlyList<EvolutionExpectation> InForce(IReadOnlyList<ExpectedRange>? overrides, bool sbAtFixedLuminosity = false, bool compactRadioSources = false)
    {
        var list = compactRadioSources ? []
            : Shipped.Where(e => !(sbAtFixedLuminosity && e.Parameter == NuisanceParameters.Names.SbEvolution)).ToList();
        foreach (var o in overrides ?? [])
        {
            int i = list.FindIndex(e => e.Parameter == o.Parameter);
            if (i >= 0 && list[i].Lo == o.Lo && list[i].Hi == o.Hi) continue; // the study restates the shipped range: keep its sources
            double w = o.Hi - o.Lo;
            var row = new EvolutionExpectation(o.Parameter, i >= 0 ? list[i].Population : "as given by the study",
                o.Lo, o.Hi, i >= 0 ? list[i].ExpectedSign : 0, o.Lo - w, o.Hi + w, "the study file's [expected] table");
            if (i >= 0) list[i] = row; else list.Add(row);
        }
        return list;
    }

    /// <summary>
    /// Judges a required value with its 68% interval [lo, hi]: <see cref="Plausibility.WrongSign"/> when the whole
    /// interval has the sign opposite to the expected one; <see cref="Plausibility.Plausible"/> when the interval
    /// overlaps the plausible range; <see cref="Plausibility.FarOutside"/> when it lies wholly outside the far range;
    /// <see cref="Plausibility.Outside"/> otherwise.
    /// </summary>
    public Plausibility Judge(double value, double lo, double hi)
    {
        if (!double.IsFinite(value)) return Plausibility.NotJudged;
        if (!double.IsFinite(lo)) lo = value;
        if (!double.IsFinite(hi)) hi = value;
        if (ExpectedSign > 0 && hi < 0) return Plausibility.WrongSign;
        if (ExpectedSign < 0 && lo > 0) return Plausibility.WrongSign;
        if (hi >= Lo && lo <= Hi) return Plausibility.Plausible;
        if (hi < FarLo || lo > FarHi) return Plausibility.FarOutside;
        return Plausibility.Outside;
    }

    private static IReadOnlyList<EvolutionExpectation> Load()
    {
        using var stream = typeof(EvolutionExpectation).Assembly.GetManifestResourceStream("SizeTest.evolution-expectations.txt")
                           ?? throw new InvalidOperationException("the expectation table is not embedded in the library");
        using var ms = new MemoryStream();
        stream.CopyTo(ms);
        return Parse(System.Text.Encoding.UTF8.GetString(ms.ToArray()));
    }

    /// <summary>Parses the table format ('#' comments, fields split by '|').</summary>
    public static IReadOnlyList<EvolutionExpectation> Parse(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        var inv = CultureInfo.InvariantCulture;
        var rows = new List<EvolutionExpectation>();
        foreach (var raw in text.Split('\n'))
        {
            var line = raw.Trim();
            if (line.Length == 0 || line.StartsWith('#')) continue;
            var f = line.Split('|').Select(s => s.Trim()).ToArray();
            if (f.Length != 8) throw new FormatException($"expectation row needs 8 fields: {line}");
            int sign = f[4] switch { "positive" => 1, "negative" => -1, _ => 0 };
            rows.Add(new EvolutionExpectation(f[0], f[1], double.Parse(f[2], inv), double.Parse(f[3], inv), sign,
                double.Parse(f[5], inv), double.Parse(f[6], inv), f[7]));
        }
        return rows;
    }
}

/// <summary>How a required evolution compares with published expectations.</summary>
public enum Plausibility
{
    /// <summary>No expectation, or the parameter was fixed.</summary>
    NotJudged,
    /// <summary>The 68% interval overlaps the plausible range.</summary>
    Plausible,
    /// <summary>Outside the plausible range, but not far and of the right sign.</summary>
    Outside,
    /// <summary>Wholly beyond the far range.</summary>
    FarOutside,
    /// <summary>The whole interval has the sign opposite to the physically expected one.</summary>
    WrongSign,
}

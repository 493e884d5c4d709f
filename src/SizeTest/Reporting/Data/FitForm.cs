using SizeTest.Inference.Comparison;

namespace SizeTest.Reporting.Data;

/// <summary>
/// The form of the fits in a report, read from the fitted parameter names: populations (<c>NAME@GROUP</c>, from
/// <c>--group</c>) and binned evolution (<c>r0_kpc_binK</c> / <c>mu0_binK</c>, from <c>--evolution binned:K</c>). Such fits
/// have no single R0 (1+z)^a curve, and the report's words say so instead of describing one.
/// </summary>
public static class FitForm
{
    /// <summary>The population labels of a grouped fit, sorted; empty when no parameter belongs to a group.</summary>
    public static IReadOnlyList<string> Groups(ReportData data)
    {
        ArgumentNullException.ThrowIfNull(data);
        return data.Models.SelectMany(m => m.Fit.Parameters).Select(p => EvolutionTestTable.GroupOf(p.Name)).OfType<string>()
            .Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal).ToList();
    }

    /// <summary>The number of redshift bins of a binned-evolution fit (the largest K of <c>r0_kpc_binK</c> or <c>mu0_binK</c>), or 0.</summary>
    public static int Bins(ReportData data)
    {
        ArgumentNullException.ThrowIfNull(data);
        int most = 0;
        foreach (var p in data.Models.SelectMany(m => m.Fit.Parameters))
        {
            var name = EvolutionTestTable.BaseName(p.Name);
            foreach (var stem in (string[])["r0_kpc_bin", "mu0_bin"])
                if (name.StartsWith(stem, StringComparison.Ordinal) && int.TryParse(name.AsSpan(stem.Length), System.Globalization.NumberStyles.None, System.Globalization.CultureInfo.InvariantCulture, out int k))
                    most = Math.Max(most, k);
        }
        return most;
    }

    /// <summary>
    /// Why no model line is drawn through the objects, when the fits have no single curve (binned evolution, populations),
    /// or null when they have one. <paramref name="quantity"/> names what each population has its own of ("R0, a and scatter").
    /// </summary>
    public static string? WhyNoModelLine(ReportData data, string quantity)
    {
        int bins = Bins(data);
        var groups = Groups(data);
        string per = groups.Count > 0 ? $" in each population of the group column ({string.Join(", ", groups)})" : "";
        if (bins > 0)
            return $"No model line is drawn: with binned evolution each model has one {(quantity.StartsWith('μ') ? "μ0" : "R0")} per redshift bin ({bins} bins){per} instead of a power law in 1+z, " +
                   "so no single curve describes it; the binned-evolution figure shows what each bin requires, with each model's power-law counterpart drawn over it. ";
        if (groups.Count > 0)
            return $"No model line is drawn: each population of the group column ({string.Join(", ", groups)}) has its own {quantity}, with the world model shared, " +
                   "so no single best-fit curve describes the whole sample; each group's estimates are in the parameter table and its evolution in the evolution tests. ";
        return null;
    }
}

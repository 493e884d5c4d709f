using SizeTest.Foundation.Errors;
using System.Globalization;
using SizeTest.Foundation.Angles;

namespace SizeTest.Catalogues;

/// <summary>
/// Warns when the angular sizes, in the unit they were read in, are implausible for the objects SizeTest fits, which
/// is what a wrong unit looks like: <c>--col theta=theta:deg</c> on arcsec values makes every galaxy 3600× too big
/// and the fit still converges (issue 14 point 8). The check is on the median θ of the accepted rows, so a few odd
/// objects do not trigger it.
/// </summary>
/// <remarks>
/// Bounds (common practice, with a wide margin): galaxy effective radii are 1–10 kpc, and even 30 kpc at z = 0.01
/// (D_A ≈ cz/H0 ≈ 43 Mpc for H0 = 70) subtends 30/43 000 rad ≈ 144″, so a median above 600″ (10′) is no sample of
/// galaxies or compact radio sources beyond the Local Group. Compact radio sources are ~1 mas across and VLBI resolves
/// ~0.1 mas (space VLBI ~10 µas), so a median below 10⁻⁵″ (10 µas) is not a measured size either.
/// </remarks>
public static class AngularSizePlausibility
{
    /// <summary>The largest plausible median θ, arcsec (10′).</summary>
    public const double MaxMedianArcsec = 600;

    /// <summary>The smallest plausible median θ, arcsec (10 µas).</summary>
    public const double MinMedianArcsec = 1e-5;

    /// <summary>The warnings (each with the <c>warning: </c> prefix) for sizes <paramref name="thetaRad"/> (radians) read
    /// through <paramref name="mapping"/>; empty when θ is not mapped, there are no rows, or the median is plausible.</summary>
    public static IReadOnlyList<string> Check(IReadOnlyList<double>? thetaRad, ResolvedMapping mapping)
    {
        ArgumentNullException.ThrowIfNull(mapping);
        if (thetaRad is null || thetaRad.Count == 0 || !mapping.Roles.TryGetValue(ColumnRole.Theta, out var b) || b.IsRelative) return [];
        var finite = thetaRad.Where(double.IsFinite).ToArray();
        if (finite.Length == 0) return [];
        // Selection, not a sort: O(n) (a 10⁶-row sort cost 0.15 s of the load); the middle pair's mean for even n.
        double median = MathNet.Numerics.Statistics.ArrayStatistics.MedianInplace(finite) * AngleUnits.ArcsecPerRadian;
        if (median is >= MinMedianArcsec and <= MaxMedianArcsec) return [];
        string bound = median > MaxMedianArcsec
            ? $"above {MaxMedianArcsec.ToString(CultureInfo.InvariantCulture)} arcsec (10 arcmin), larger than any sample of galaxies or compact radio sources"
            : $"below {MinMedianArcsec.ToString(CultureInfo.InvariantCulture)} arcsec (10 µas), smaller than any measured size";
        // The median as the file wrote it (the value before the unit's scale) tells the user which unit it was in.
        double asWritten = b.Scale > 0 ? median / AngleUnits.ArcsecPerRadian / b.Scale : double.NaN;
        string written = double.IsFinite(asWritten) ? $"; the file's median value is {G(asWritten)}" : "";
        return [SettingProblem.Text($"warning: the median angular size of theta column '{b.ColumnName}' is {G(median)} arcsec when read in {b.Unit} ({new SettingText(b.UnitReason)}), {bound}{written}; check the unit ({{col}} theta={b.ColumnName}:UNIT)")];
    }

    private static string G(double v) => v.ToString("G4", CultureInfo.InvariantCulture);
}

using System.Globalization;
using SizeTest.Catalogs;
using SizeTest.Common;
using SizeTest.Photometry;

namespace SizeTest.Inference;

/// <summary>
/// The pre-fit data step that makes the sample consistent with the selection the likelihood models
/// (<see cref="SelectionLimits"/>): an object that breaks a stated cut has zero density under the truncated
/// model, so keeping it makes the likelihood meaningless (a truncated density renormalised by a vanishing
/// selection probability grows without bound). Such objects are moved to the reject log with the reason
/// <c>outside selection: sb_limit</c> (<c>mag_limit</c>, <c>min_size</c>) and counted in a warning; when more
/// than <see cref="DefaultMaxOutsideFraction"/> of the sample (or the configured fraction) lies outside, or no
/// object is left, the fit is refused with an <see cref="InputException"/> (exit 2): the stated cut does not
/// describe this catalogue.
/// </summary>
/// <remarks>
/// The cuts are applied exactly as the likelihood applies them to the observables: μ &lt; sb_limit on the
/// zero-pointed surface brightness, θ &gt; min_size, and m &lt; mag_limit with
/// m = μ − 5 log10(θ/arcsec) − 2.5 log10(2π) (the mean surface brightness within the half-light radius;
/// see <see cref="SelectionLimits"/>). Only cuts the fitted observable models are applied
/// (<see cref="NuisanceModel.Validate"/> refuses the others).
/// </remarks>
public static class SelectionConsistency
{
    /// <summary>Default largest fraction of the sample that may lie outside the stated cuts (5%).</summary>
    public const double DefaultMaxOutsideFraction = 0.05;

    /// <summary>Applies the cuts of <paramref name="nuisance"/> to <paramref name="load"/> and <paramref name="observables"/> (row for row).</summary>
    /// <param name="load">The loaded sample (its accepted objects are the rows of <paramref name="observables"/>).</param>
    /// <param name="observables">The observables built from <paramref name="load"/>'s sample.</param>
    /// <param name="nuisance">The nuisance model with the stated cuts.</param>
    /// <param name="maxOutsideFraction">Refuse when more than this fraction of the objects lies outside (0–1).</param>
    /// <exception cref="InputException">Too many objects outside, or none left.</exception>
    public static SelectionConsistencyResult Apply(SampleLoad load, Observables observables, NuisanceModel nuisance, double maxOutsideFraction = DefaultMaxOutsideFraction)
    {
        ArgumentNullException.ThrowIfNull(load);
        ArgumentNullException.ThrowIfNull(observables);
        ArgumentNullException.ThrowIfNull(nuisance);
        if (!(maxOutsideFraction >= 0 && maxOutsideFraction <= 1))
            throw new InputException($"the largest fraction outside the selection must be between 0 and 1; got {maxOutsideFraction.ToString(CultureInfo.InvariantCulture)}");
        int n = observables.Count;
        if (n != load.Sample.Count) throw new ArgumentException("the observables do not match the sample row for row");
        var cuts = nuisance.Cuts;
        if (cuts.IsEmpty || n == 0) return new SelectionConsistencyResult(load, observables, 0, []);
        bool size = nuisance.Observable != ObservableKind.SurfaceBrightness, sb = nuisance.Observable != ObservableKind.Size;
        double[]? lnTheta = size ? observables.LnTheta : null;
        double[]? mu = sb ? observables.Mu : null;
        double lnMin = cuts.MinThetaArcsec is { } t ? Math.Log(t * Units.RadiansPerArcsec) : double.NaN;
        var keep = new List<int>(n);
        var rejected = new List<RejectEntry>();
        var counts = new Dictionary<RejectReason, int>();
        for (int i = 0; i < n; i++)
        {
            RejectEntry? entry = null;
            if (cuts.MinThetaArcsec is { } minT && lnTheta is not null && !(lnTheta[i] > lnMin))
                entry = Entry(load, i, "theta", Math.Exp(lnTheta[i]) * Units.ArcsecPerRadian, RejectReason.OutsideMinSize, $"θ must be > {F(minT)} arcsec (--min-size)");
            else if (cuts.SbLimit is { } s && mu is not null && !(mu[i] < s))
                entry = Entry(load, i, "mu", mu[i], RejectReason.OutsideSbLimit, $"μ must be < {F(s)} mag/arcsec2 (--sb-limit)");
            else if (cuts.MagLimit is { } m && mu is not null && observables.LnTheta is { } lt)
            {
                double mag = mu[i] - 5.0 * Math.Log10(Math.Exp(lt[i]) * Units.ArcsecPerRadian) - 2.5 * Math.Log10(2 * Math.PI);
                if (!(mag < m)) entry = Entry(load, i, "mag", mag, RejectReason.OutsideMagLimit, $"m = μ − 5 log10 θ − 2.5 log10 2π must be < {F(m)} (--mag-limit)");
            }
            if (entry is null) { keep.Add(i); continue; }
            rejected.Add(entry);
            counts[entry.Reason] = counts.GetValueOrDefault(entry.Reason) + 1;
        }
        if (rejected.Count == 0) return new SelectionConsistencyResult(load, observables, 0, []);
        string detail = string.Join(", ", counts.OrderBy(kv => kv.Key).Select(kv => $"{kv.Value} {kv.Key.Code()["outside selection: ".Length..]}"));
        double fraction = (double)rejected.Count / n;
        if (keep.Count == 0)
            throw new InputException($"every one of the {n} objects lies outside the stated selection ({detail}); the likelihood is not defined there; check --sb-limit, --mag-limit and --min-size against the catalogue", load.Sample.SourceName);
        if (fraction > maxOutsideFraction)
            throw new InputException($"{rejected.Count} of {n} objects ({Pct(fraction, "0.0")}) lie outside the stated selection ({detail}), more than the {Pct(maxOutsideFraction, "0.##")} allowed; the cut does not describe this catalogue; check the limits (or raise --max-outside-selection)", load.Sample.SourceName);
        var warning = $"{rejected.Count} of {n} objects lie outside the stated selection ({detail}); they were moved to the reject log and not fitted";
        return new SelectionConsistencyResult(load.WithRejected(keep, rejected), ObservablesSubset.Take(observables, keep.ToArray()), rejected.Count, [warning]);
    }

    private static RejectEntry Entry(SampleLoad load, int i, string role, double value, RejectReason reason, string detail)
    {
        string column = load.Mapping.Roles.TryGetValue(role switch { "theta" => ColumnRole.Theta, "mu" => ColumnRole.Mu, _ => ColumnRole.Mag }, out var b) ? b.ColumnName : role;
        return new RejectEntry(load.Sample.SourceRows[i], column, F(value), reason, detail);
    }

    private static string Pct(double f, string format) => (100 * f).ToString(format, CultureInfo.InvariantCulture) + "%";

    private static string F(double v) => v.ToString("G6", CultureInfo.InvariantCulture);
}

/// <summary>The outcome of <see cref="SelectionConsistency.Apply"/>.</summary>
/// <param name="Load">The load with objects outside the cuts moved to the reject log.</param>
/// <param name="Observables">The observables of the kept objects.</param>
/// <param name="Outside">Objects removed.</param>
/// <param name="Warnings">One warning line when objects were removed, else empty.</param>
public sealed record SelectionConsistencyResult(SampleLoad Load, Observables Observables, int Outside, IReadOnlyList<string> Warnings);

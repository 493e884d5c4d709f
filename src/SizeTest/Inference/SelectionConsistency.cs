using System.Globalization;
using SizeTest.Catalogues;
using SizeTest.Foundation.Errors;
using SizeTest.Photometry;
using SizeTest.Foundation.Angles;

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
/// see <see cref="SelectionLimits"/>); in a size or joint fit with the size–luminosity relation the limit is checked on the magnitude column
/// the luminosities come from instead (a size fit whose luminosities come from another column is refused) (the likelihood conditions on those magnitudes and does not truncate on them). Only cuts the fitted observable models are applied
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
    /// <param name="survey">The survey request, whose stated photo-z prior is a cut for objects with exact redshifts (null: none).</param>
    public static SelectionConsistencyResult Apply(CatalogueLoad load, Observables observables, NuisanceModel nuisance, double maxOutsideFraction = DefaultMaxOutsideFraction,
        Survey.SurveyRequest? survey = null)
    {
        ArgumentNullException.ThrowIfNull(load);
        ArgumentNullException.ThrowIfNull(observables);
        ArgumentNullException.ThrowIfNull(nuisance);
        if (!(maxOutsideFraction >= 0 && maxOutsideFraction <= 1))
            throw new InputException($"the largest fraction outside the selection must be between 0 and 1; got {maxOutsideFraction.ToString(CultureInfo.InvariantCulture)}");
        int n = observables.Count;
        if (n != load.Rows.Count) throw new ArgumentException("the observables do not match the sample row for row");
        var split = Classify(observables, nuisance, i => load.Rows.SourceRows[i], role => load.Mapping.Roles.TryGetValue(role, out var b) ? b.ColumnName : role.Name(), survey);
        if (split.Outside.Count == 0) return new SelectionConsistencyResult(load, observables, 0, []);
        var warning = Decide(split.Outside.Count, n, split.Describe(), maxOutsideFraction, load.Rows.SourceName);
        return new SelectionConsistencyResult(load.WithRejected(split.Keep, split.Outside), ObservablesSubset.Take(observables, split.Keep.ToArray()), split.Outside.Count, [warning]);
    }

    /// <summary>
    /// Splits the objects of <paramref name="observables"/> into those inside the stated cuts and reject entries for
    /// the others (no decision, no collective step: under MPI each rank classifies its share and the counts are summed).
    /// </summary>
    /// <param name="observables">The observables.</param>
    /// <param name="nuisance">The nuisance model with the stated cuts.</param>
    /// <param name="sourceRow">Source row (1-based file line or table row) of object i, for the reject log.</param>
    /// <param name="columnName">The catalogue column of a role, for the reject log.</param>
    /// <param name="survey">The survey request (null: none): an object with z_err = 0 outside its stated photo-z prior has no density
    /// under the prior (<see cref="Survey.SurveyRequest.OutsideRedshiftPrior"/>) and is moved out with reason <c>z_prior</c>.</param>
    public static SelectionSplit Classify(Observables observables, NuisanceModel nuisance, Func<int, long> sourceRow, Func<ColumnRole, string> columnName,
        Survey.SurveyRequest? survey = null)
    {
        ArgumentNullException.ThrowIfNull(observables);
        ArgumentNullException.ThrowIfNull(nuisance);
        int n = observables.Count;
        var cuts = nuisance.Cuts;
        var keep = new List<int>(n);
        var rejected = new List<RejectEntry>();
        bool zPrior = survey?.HasStatedRedshiftPrior(observables, nuisance.Observable) == true;
        if (cuts.IsEmpty && !zPrior)
        {
            for (int i = 0; i < n; i++) keep.Add(i);
            return new SelectionSplit(keep, rejected);
        }
        bool size = nuisance.Observable != ObservableKind.SurfaceBrightness, sb = nuisance.Observable != ObservableKind.Size;
        double[]? lnTheta = size ? observables.LnTheta : null;
        double[]? mu = sb ? observables.Mu : null;
        var relation = survey?.Relation ?? nuisance.SurveyTerms.Relation;
        double[]? magnitudes = size && relation == Survey.SizeRelationKind.Luminosity ? observables.Mag : null;
        // A size fit conditioned on the luminosities can only honour a magnitude limit on the apparent magnitudes they come from.
        if (cuts.MagLimit is not null && !sb && relation == Survey.SizeRelationKind.Luminosity
            && (magnitudes is null || observables.Survey.Luminosity is { Kind: not LuminosityKind.ApparentMagnitude }))
            throw SettingProblem.Input($"a magnitude limit in a size-only fit ({{observable}} size) with {{size_luminosity}} selects on the apparent magnitudes the luminosities come from, but this sample's luminosities come from {LuminositySource(observables)}; map the catalogue's apparent magnitudes with {{col}} mag=NAME, or drop {{mag_limit}}");
        double lnMin = cuts.MinThetaArcsec is { } t ? Math.Log(t * AngleUnits.RadiansPerArcsec) : double.NaN;
        for (int i = 0; i < n; i++)
        {
            RejectEntry? entry = null;
            if (cuts.MinThetaArcsec is { } minT && lnTheta is not null && !(lnTheta[i] > lnMin))
                entry = new(sourceRow(i), columnName(ColumnRole.Theta), F(Math.Exp(lnTheta[i]) * AngleUnits.ArcsecPerRadian), RejectReason.OutsideMinSize, $"θ must be > {F(minT)} arcsec (the minimum size)");
            else if (cuts.SbLimit is { } s && mu is not null && !(mu[i] < s))
                entry = new(sourceRow(i), columnName(ColumnRole.Mu), F(mu[i]), RejectReason.OutsideSbLimit, $"μ must be < {F(s)} mag/arcsec2 (the surface-brightness limit)");
            else if (cuts.MagLimit is { } m && magnitudes is not null)
            {
                // The size–luminosity relation's own magnitudes: the limit selects on the photometry the luminosities come from.
                if (!(magnitudes[i] < m)) entry = new(sourceRow(i), columnName(ColumnRole.Mag), F(magnitudes[i]), RejectReason.OutsideMagLimit, $"m must be < {F(m)} (the magnitude limit)");
            }
            else if (cuts.MagLimit is { } lim && mu is not null && observables.LnTheta is { } lt)
            {
                double mag = mu[i] - 5.0 * Math.Log10(Math.Exp(lt[i]) * AngleUnits.ArcsecPerRadian) - 2.5 * Math.Log10(2 * Math.PI);
                if (!(mag < lim)) entry = new(sourceRow(i), columnName(ColumnRole.Mu), F(mag), RejectReason.OutsideMagLimit, $"m = μ − 5 log10 θ − 2.5 log10 2π must be < {F(lim)} (the magnitude limit)");
            }
            if (entry is null && zPrior && survey!.OutsideRedshiftPrior(observables, nuisance.Observable, i))
                entry = new(sourceRow(i), columnName(ColumnRole.Z), F(observables.Z[i]), RejectReason.OutsideRedshiftPrior,
                    $"z_err = 0 and z outside the redshift prior [{F(survey.RedshiftPriorMin ?? 0)}, {(survey.RedshiftPriorMax is { } hi ? F(hi) : "inf")}]: no density under the prior");
            if (entry is null) keep.Add(i); else rejected.Add(entry);
        }
        return new SelectionSplit(keep, rejected);
    }

    /// <summary>
    /// The decision on <paramref name="outside"/> of <paramref name="total"/> objects outside the cuts: the warning line,
    /// or an <see cref="InputException"/> when none is left or more than <paramref name="maxOutsideFraction"/> is outside.
    /// </summary>
    public static string Decide(long outside, long total, string detail, double maxOutsideFraction, string? source)
    {
        double fraction = total == 0 ? 0 : (double)outside / total;
        if (outside >= total)
            throw SettingProblem.Input($"every one of the {total} objects lies outside the stated selection ({detail}); the likelihood is not defined there; check {{sb_limit}}, {{mag_limit}} and {{min_size}} against the catalogue", source);
        if (fraction > maxOutsideFraction)
            throw SettingProblem.Input($"{outside} of {total} objects ({Pct(fraction, "0.0")}) lie outside the stated selection ({detail}), more than the {Pct(maxOutsideFraction, "0.##")} allowed; the cut does not describe this catalogue; check the limits (or raise {{max_outside_selection}})", source);
        return $"{outside} of {total} objects lie outside the stated selection ({detail}); they were moved to the reject log and not fitted";
    }

    private static string LuminositySource(Observables o) => o.Survey.Luminosity?.Kind switch
    {
        LuminosityKind.FluxDensity => "radio flux densities (flux_density)",
        LuminosityKind.AbsoluteMagnitude => "absolute magnitudes (abs_mag)",
        LuminosityKind.StellarMass => "stellar masses (log_mass)",
        _ => "no mag column",
    };

    private static string Pct(double f, string format) => (100 * f).ToString(format, CultureInfo.InvariantCulture) + "%";

    private static string F(double v) => v.ToString("G6", CultureInfo.InvariantCulture);
}

/// <summary>Objects inside the cuts (indices, ascending) and reject entries for the others.</summary>
/// <param name="Keep">Indices of the objects inside every cut.</param>
/// <param name="Outside">One reject entry per object outside.</param>
public sealed record SelectionSplit(IReadOnlyList<int> Keep, IReadOnlyList<RejectEntry> Outside)
{
    /// <summary>Counts per cut, e.g. <c>6 sb_limit, 2 min_size</c>.</summary>
    public string Describe() => Describe(Outside.GroupBy(e => e.Reason).OrderBy(g => g.Key).Select(g => (g.Key, (long)g.Count())));

    /// <summary>Counts per cut as text.</summary>
    public static string Describe(IEnumerable<(RejectReason Reason, long Count)> counts) =>
        string.Join(", ", counts.Where(c => c.Count > 0).Select(c => $"{c.Count} {c.Reason.Code()["outside selection: ".Length..]}"));
}

/// <summary>The outcome of <see cref="SelectionConsistency.Apply"/>.</summary>
/// <param name="Load">The load with objects outside the cuts moved to the reject log.</param>
/// <param name="Observables">The observables of the kept objects.</param>
/// <param name="Outside">Objects removed.</param>
/// <param name="Warnings">One warning line when objects were removed, else empty.</param>
public sealed record SelectionConsistencyResult(CatalogueLoad Load, Observables Observables, int Outside, IReadOnlyList<string> Warnings);

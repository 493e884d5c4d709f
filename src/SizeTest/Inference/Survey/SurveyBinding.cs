using SizeTest.Photometry;

namespace SizeTest.Inference.Survey;

/// <summary>
/// The hypotheses with their survey terms for a loaded sample (group labels, redshift-bin edges and z_err are known
/// only then), the notes that say what was decided, and a warning to print (large fractional size errors).
/// One code path for <c>fit</c> and for study files.
/// </summary>
/// <param name="Hypotheses">One hypothesis per world model, with the survey terms.</param>
/// <param name="Notes">What was decided (photo-z marginalisation, groups, luminosities), for the results' notes.</param>
/// <param name="Warning">A warning for the terminal, or null.</param>
public sealed record SurveyBinding(IReadOnlyList<Hypothesis> Hypotheses, IReadOnlyList<string> Notes, string? Warning)
{
    /// <summary>
    /// Builds the survey model of <paramref name="request"/> for <paramref name="observables"/> and, when it is active
    /// (or <paramref name="asked"/>), rebuilds every hypothesis with it.
    /// </summary>
    /// <param name="request">What was asked.</param>
    /// <param name="asked">Whether any survey setting was given (then the hypotheses are rebuilt even when the model turns out inactive).</param>
    /// <param name="observables">The loaded, selected sample.</param>
    /// <param name="nuisance">The nuisance model without survey terms.</param>
    /// <param name="plain">The hypotheses without survey terms (returned when nothing is active).</param>
    /// <param name="rebuild">Builds one hypothesis per world model for a nuisance model with survey terms (the caller
    /// applies its own parameter settings and checks their names).</param>
    /// <param name="wholeSample">When <paramref name="observables"/> are one rank's share, the whole sample's redshift range
    /// (the default photo-z prior the notes state); null: these objects are the sample. A share may be empty: the hypotheses
    /// are rebuilt alike on every rank.</param>
    /// <param name="wholeSampleCoverage">With <paramref name="wholeSample"/>, the whole sample's counts against a stated
    /// redshift prior (<see cref="SurveyRequest.PriorCoverage"/> summed over ranks); null: count <paramref name="observables"/>.</param>
    public static SurveyBinding Bind(SurveyRequest request, bool asked, Observables observables, NuisanceModel nuisance,
        IReadOnlyList<Hypothesis> plain, Func<NuisanceModel, IReadOnlyList<Hypothesis>> rebuild, RedshiftGridSpan? wholeSample = null,
        RedshiftPriorCoverage? wholeSampleCoverage = null)
    {
        ArgumentNullException.ThrowIfNull(request);
        ArgumentNullException.ThrowIfNull(observables);
        ArgumentNullException.ThrowIfNull(nuisance);
        ArgumentNullException.ThrowIfNull(rebuild);
        var notes = new List<string>();
        var model = request.Build(observables, nuisance.Observable, notes, wholeSample is not null, wholeSampleCoverage);
        var hypotheses = plain;
        if ((model.IsActive || asked) && (observables.Count > 0 || wholeSample is not null))
        {
            var withSurvey = nuisance with { Survey = model };
            withSurvey.Validate();
            hypotheses = rebuild(withSurvey);
            if (observables.Count > 0)
                foreach (var h in hypotheses)
                {
                    var likelihood = new HypothesisLikelihood(h, observables, wholeSample);
                    foreach (var note in likelihood.SurveyNotes)
                        if (!notes.Contains(note)) notes.Add(note);
                    // Under mpirun (a share of the sample) the caller adds these with the whole sample's counts (WithWindowCounts).
                    if (model.HasWindow && wholeSample is null)
                        notes.Add(LuminosityWindowNote.Text(likelihood.ModelWeights(0, observables.Count).Objects, observables.Count, model, h.Family.Name));
                }
        }
        string? warning = nuisance.Observable != ObservableKind.SurfaceBrightness ? SizeErrorCheck.LargeErrorWarning(observables, model.SizeErrors) : null;
        if (warning is not null) notes.Add("warning: " + warning);
        return new SurveyBinding(hypotheses, notes, warning);
    }

    /// <summary>Whether the hypotheses carry a luminosity window, whose per-model counts need the whole sample.</summary>
    public bool HasWindow => Hypotheses.Count > 0 && Hypotheses[0].Nuisance.SurveyTerms.HasWindow;

    /// <summary>Objects of <paramref name="share"/> (one rank's part of the sample) that each hypothesis's luminosity window keeps,
    /// in hypothesis order (zeros for an empty share); the caller sums them over ranks for <see cref="WithWindowCounts"/>.</summary>
    /// <param name="share">This rank's objects.</param>
    /// <param name="wholeSample">The whole sample's redshift range (as given to <see cref="Bind"/>).</param>
    public double[] WindowObjects(Observables share, RedshiftGridSpan? wholeSample)
    {
        ArgumentNullException.ThrowIfNull(share);
        var kept = new double[Hypotheses.Count];
        if (!HasWindow || share.Count == 0) return kept;
        for (int m = 0; m < kept.Length; m++) kept[m] = new HypothesisLikelihood(Hypotheses[m], share, wholeSample).ModelWeights(0, share.Count).Objects;
        return kept;
    }

    /// <summary>This binding with the luminosity window's notes for the whole sample: <paramref name="kept"/>[m] of
    /// <paramref name="total"/> objects inside hypothesis m's window (sums of <see cref="WindowObjects"/> over ranks).</summary>
    /// <exception cref="Foundation.Errors.InputException">A world model keeps no object.</exception>
    public SurveyBinding WithWindowCounts(IReadOnlyList<double> kept, long total)
    {
        ArgumentNullException.ThrowIfNull(kept);
        if (!HasWindow) return this;
        var notes = Notes.ToList();
        for (int m = 0; m < Hypotheses.Count; m++)
        {
            if (kept[m] == 0) throw LuminosityWindowNote.NoneInside(Hypotheses[m].Family.Name);
            notes.Add(LuminosityWindowNote.Text((long)kept[m], total, Hypotheses[m].Nuisance.SurveyTerms, Hypotheses[m].Family.Name));
        }
        return this with { Notes = notes };
    }

    /// <summary>Whether <paramref name="request"/> asks for anything beyond the basic model (a group column counts).</summary>
    public static bool IsAsked(SurveyRequest request, string? groupColumn) =>
        request with { Pivot = null, IgnoreZErr = false } != SurveyRequest.None || groupColumn is not null;
}

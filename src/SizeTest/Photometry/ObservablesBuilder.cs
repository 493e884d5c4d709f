using System.Globalization;
using SizeTest.Catalogues;
using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Angles;

namespace SizeTest.Photometry;

/// <summary>
/// Applies <see cref="PhotometryOptions"/> to a <see cref="CatalogueRows"/>: zero points (to AB),
/// band matching, surface-brightness definition, and the per-object K-correction and
/// extinction that the model adds: μ_model,i = μ_rest + 2.5 n_bol log10(1+z_i) + evolution + K_i + A_i.
/// </summary>
/// <remarks>
/// Order of operations per object: choose band(s) → μ (and m) + zero-point offset of the
/// band → SB-definition conversion (Sérsic n) → K_i, A_i for the same band(s). Configuration
/// problems (a missing column, a band absent from a table, a template that does not cover a
/// redshift) throw <see cref="InputException"/> naming the sample, row and column.
/// </remarks>
public static class ObservablesBuilder
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <summary>Builds the observables and the list of corrections applied.</summary>
    /// <exception cref="InputException">The options do not fit the sample (see remarks).</exception>
    public static PhotometryResult Build(CatalogueRows sample, PhotometryOptions options)
    {
        ArgumentNullException.ThrowIfNull(sample);
        ArgumentNullException.ThrowIfNull(options);
        var notes = new List<string>();
        int n = sample.Count;
        var basic = Observables.FromRows(sample);

        double? sersic = options.SersicIndex;
        if (sersic is { } sn && !SersicProfile.IsValidIndex(sn))
            throw new InputException($"Sérsic index {F(sn)} is outside the accepted range {F(SersicProfile.MinIndex)}–{F(SersicProfile.MaxIndex)}.");

        var match = options.BandMatch is { } bm ? BandMatchPlan.Create(sample, bm) : null;

        // --- surface brightness and magnitudes, zero-pointed to AB
        double[]? mu, muErr;
        double[]? mag = Copy(sample.Mag);
        if (mag is not null) ApplyZeroPoints(sample, options, mag);
        if (match is not null)
        {
            if (options.SurfaceBrightness.FromMagnitude)
                throw new InputException("Band matching takes surface brightness from the band columns; it cannot be combined with surface brightness from magnitudes.");
            (mu, muErr) = match.SurfaceBrightness(sample, options.ZeroPoints);
            notes.AddRange(match.Describe());
        }
        else if (options.SurfaceBrightness.FromMagnitude)
        {
            if (mag is null || sample.ThetaRad is null)
                throw new InputException($"{sample.SourceName}: surface brightness from magnitudes needs both a 'mag' and a 'theta' column.");
            mu = new double[n];
            // Without a mag_err column the size error still propagates: σ_⟨μ⟩ = 5/ln10 · σ_R/R (the magnitude taken as exact).
            bool sizeErrors = sample.ThetaErrRad is not null;
            muErr = sample.MagErr is null && !sizeErrors ? null : new double[n];
            for (int i = 0; i < n; i++)
            {
                double reArcsec = sample.ThetaRad[i] * AngleUnits.ArcsecPerRadian;
                mu[i] = SurfaceBrightness.MeanWithinEffective(mag[i], reArcsec);
                if (muErr is not null)
                {
                    // ⟨μ⟩_e = m + 5 log10 R_e + 2.5 log10 2π, so ∂⟨μ⟩/∂ln R_e = 5/ln10 and
                    // σ_⟨μ⟩² = σ_m² + (5/ln10 · σ_R/R)²  (errors taken as independent)
                    double rel = basic.LnThetaErr is { } le ? le[i] : 0.0;
                    double sm = sample.MagErr?[i] ?? 0.0;
                    muErr[i] = Math.Sqrt(sm * sm + Math.Pow(5.0 / Math.Log(10.0) * rel, 2));
                }
            }
            notes.Add("surface brightness: <mu>_e = m + 2.5 log10(2 pi R_e^2) from the total magnitude and the size column (R_e in arcsec; Graham & Driver 2005); " +
                      (sample.MagErr is not null ? "its error combines sigma_m and 5/ln10 sigma_R/R, which correlates it with ln theta."
                       : sizeErrors ? "no mag_err column is mapped, so its error is the size term 5/ln10 sigma_R/R alone (the magnitudes taken as exact; map mag_err to add theirs), which correlates it with ln theta."
                       : "neither mag_err nor theta_err is mapped, so it has no measurement error and the SB scatter absorbs all of it."));
        }
        else
        {
            mu = Copy(sample.Mu);
            muErr = sample.MuErr;
            if (mu is not null) ApplyZeroPoints(sample, options, mu);
        }

        // --- SB definition
        var sb = options.SurfaceBrightness;
        var inKind = sb.FromMagnitude ? SurfaceBrightnessKind.MeanWithinEffective : sb.InputKind;
        if (sb.OutputKind is { } outKind && mu is not null)
        {
            if (inKind is not { } ik)
                throw new InputException("Converting the surface-brightness definition needs the input definition (mean, effective or central).");
            if (ik != outKind)
            {
                if ((sersic ?? (sample.Survey.SersicN is not null ? 1.0 : null)) is not { } nn)
                    throw SettingProblem.Input($"Converting surface brightness from '{SurfaceBrightness.Token(ik)}' to '{SurfaceBrightness.Token(outKind)}' needs a Sérsic index; set it (e.g. {{sersic_n}} 4).");
                double off = SurfaceBrightness.ConversionOffset(ik, outKind, nn);
                if (sample.Survey.SersicN is { } perObject)
                {
                    for (int i = 0; i < n; i++) mu[i] += SurfaceBrightness.ConversionOffset(ik, outKind, perObject[i]);
                    notes.Add($"surface brightness converted from {SurfaceBrightness.Token(ik)} to {SurfaceBrightness.Token(outKind)} with each object's Sérsic index from the sersic_n column (Graham & Driver 2005, eqs. 7-9).");
                }
                else
                {
                    for (int i = 0; i < n; i++) mu[i] += off;
                    notes.Add($"surface brightness converted from {SurfaceBrightness.Token(ik)} to {SurfaceBrightness.Token(outKind)} for a Sérsic profile n = {F(nn)} (b_n = {F(SersicProfile.Bn(nn))}): offset {F(off)} mag (Graham & Driver 2005, eqs. 7-9).");
                }
            }
        }
        else if (inKind is { } k0 && mu is not null)
            notes.Add($"surface brightness is {SurfaceBrightness.Token(k0)}.");

        // --- K-correction and extinction
        double[]? kc = KCorrections(sample, options, match, notes);
        double[]? ext = Extinctions(sample, options, match, notes);

        // --- isophotal sizes
        double[]? iso = null;
        if (sample.SizeDefinition.Kind == SizeKind.Isophotal)
        {
            if (sample.SizeDefinition.IsophoteMagPerArcsec2 is not { } level)
                throw new InputException($"{sample.SourceName}: the sizes are isophotal but no isophote level is given.");
            if (sersic is not { } nIso && sample.Survey.SersicN is null)
                throw SettingProblem.Input($"{sample.SourceName}: the sizes are isophotal (mu_iso = {F(level)}); set a Sérsic index (e.g. {{sersic_n}} 1) so the fit can predict isophotal radii.");
            iso = new double[n];
            Array.Fill(iso, level);
            ApplyZeroPoints(sample, options, iso);
            notes.Add($"sizes are isophotal at {F(level)} mag/arcsec^2 (observed frame): the fit predicts r_iso/R_e for a Sérsic profile n = {(sample.Survey.SersicN is null ? F(sersic!.Value) : "per object")} under each world model's dimming, K and extinction.");
        }

        if (options.ZeroPoints is { } zpt)
            notes.Add(SettingProblem.Text($"zero points: AB offsets per band from {zpt.Source} added (m_AB = m + offset) to ") +
                      (match is not null ? "each matched band's surface brightness" : "surface brightness") +
                      (mag is not null ? ", magnitudes" : "") + (iso is not null ? ", the isophote" : "") +
                      "; all surface brightness is AB mag/arcsec^2.");
        var luminosity = options.Luminosity is { } lo ? Luminosities(sample, lo, mag, kc, ext, notes) : null;
        if (sample.Survey.SersicN is not null)
            notes.Add("Sérsic index: per object from the sersic_n column (used in the SB conversions and isophotal radii; the sample-wide index applies only where no column is mapped).");
        if (notes.Count == 0) notes.Add("no photometric corrections applied.");
        var survey = basic.Survey with { Luminosity = luminosity };
        var obs = new Observables(sample.Z, basic.LnTheta, basic.LnThetaErr, mu, muErr, kc, ext, mag, sample.MagErr,
            sample.SizeDefinition, iso, sersic, survey);
        return new PhotometryResult(obs, notes);
    }

    private static LuminosityData Luminosities(CatalogueRows sample, LuminosityOption o, double[]? mag, double[]? kc, double[]? ext, List<string> notes)
    {
        int n = sample.Count;
        double[] RefLn()
        {
            var reference = o.ReferenceModel;
            var r = new double[n];
            for (int i = 0; i < n; i++) r[i] = Math.Log(reference.LuminosityDistance(sample.Z[i]));
            return r;
        }
        string refText = o.Reference is null ? "flat ΛCDM (H0 = 70, Ωm = 0.3; the default — set the catalogue's own)" : $"{o.Reference.Name} {string.Join(", ", o.Reference.ParameterValues.Where(kv => double.IsFinite(kv.Value)).Select(kv => $"{kv.Key} = {F(kv.Value)}"))}";
        if (o.Mass)
        {
            var lm = sample.Survey.LogMass ?? throw SettingProblem.Input($"{sample.SourceName}: a size–mass relation needs a 'log_mass' column; map it with {{col}} log_mass=NAME");
            notes.Add($"stellar masses: log_mass taken as computed in the reference cosmology {refText}; for each world model M* is scaled by (D_L,model/D_L,ref)^2, i.e. the mass-to-light ratio is assumed not to depend on the cosmology.");
            return new LuminosityData(LuminosityKind.StellarMass, (double[])lm.Clone(), LnReferenceDistance: RefLn(), ReferenceModel: o.ReferenceModel.Name);
        }
        if (sample.Survey.FluxDensityJy is { } s)
        {
            notes.Add($"radio luminosity: L_nu = 4 pi D_L^2 S_nu (1+z)^-(1+alpha) with each world model's own D_L, alpha = {F(o.SpectralIndex)}" +
                      (o.FrequencyGhz is { } f ? $", S_nu observed at {F(f)} GHz." : "."));
            return new LuminosityData(LuminosityKind.FluxDensity, (double[])s.Clone(), SpectralIndex: o.SpectralIndex, FrequencyGhz: o.FrequencyGhz);
        }
        if (mag is not null)
        {
            double[]? corr = null;
            if (kc is not null || ext is not null)
            {
                corr = new double[n];
                for (int i = 0; i < n; i++) corr[i] = (kc?[i] ?? 0) + (ext?[i] ?? 0);
            }
            notes.Add("luminosity: absolute magnitude M = m - 5 log10(D_L/10 pc) - K - A from the apparent magnitude, computed for each world model with its own D_L (static models: their flux convention D_L = d (1+z)^q)" +
                      (corr is null ? " (no K-correction or extinction given)." : " with the K-correction and extinction above.") +
                      (sample.Survey.AbsMag is not null ? " The abs_mag column is also mapped and is not used: the apparent magnitudes take precedence (unmap mag to use abs_mag)." : ""));
            return new LuminosityData(LuminosityKind.ApparentMagnitude, mag, corr);
        }
        if (sample.Survey.AbsMag is { } am)
        {
            notes.Add($"luminosity: abs_mag taken as computed in the reference cosmology {refText}; for each world model M = M_ref - 5 log10(D_L,model/D_L,ref) (the catalogue's K-correction and extinction are kept).");
            return new LuminosityData(LuminosityKind.AbsoluteMagnitude, (double[])am.Clone(), LnReferenceDistance: RefLn(), ReferenceModel: o.ReferenceModel.Name);
        }
        throw SettingProblem.Input($"{sample.SourceName}: a size–luminosity relation or luminosity window needs 'mag', 'abs_mag' or 'flux_density'; map one with {{col}} ROLE=NAME");
    }

    private static double[]? KCorrections(CatalogueRows sample, PhotometryOptions options, BandMatchPlan? match, List<string> notes)
    {
        int n = sample.Count;
        switch (options.KCorrection)
        {
            case KCorrectionOption.None:
                notes.Add(match is null
                    ? "K-correction: none (surface brightness taken as rest-frame; the (1+z) bandwidth term is not applied)."
                    : "K-correction: none; the residual K between matched and target bands (including the (1+z) bandwidth term) is taken as zero.");
                return null;
            case KCorrectionOption.Column c:
            {
                var col = RequireColumn(sample, c.ColumnName, "K-correction");
                notes.Add(SettingProblem.Text($"K-correction: per object from column '{c.ColumnName}' (mag, added to the model; Hogg et al. 2002 convention)."));
                return (double[])col.Clone();
            }
            case KCorrectionOption.PowerLaw p:
            {
                var k = new double[n];
                if (match is null)
                {
                    for (int i = 0; i < n; i++) k[i] = PowerLawKCorrection.SameBand(p.Alpha, sample.Z[i]);
                    notes.Add($"K-correction: power law f_nu ~ nu^{F(p.Alpha)}, same band: K = -2.5 (1 + alpha) log10(1+z) (Hogg et al. 2002).");
                }
                else
                {
                    match.ResidualK(sample, new KCorrectionOption.Template(SpectralTable.PowerLaw(p.Alpha, 1e-2, 1e10), null), options.TemplateRedshiftStep, k);
                    notes.Add($"K-correction: residual K from matched band to target for a power law f_nu ~ nu^{F(p.Alpha)} (Hogg et al. 2002 eq. 8; narrow bands where no curve is given).");
                }
                return k;
            }
            case KCorrectionOption.Template t:
            {
                var k = new double[n];
                if (match is null)
                {
                    if (t.ObservedBand is null)
                        throw new InputException("A template K-correction needs the observed filter curve (filter-obs).");
                    var rest = t.RestBand ?? t.ObservedBand;
                    TemplateK(sample, t, t.ObservedBand, rest, options.TemplateRedshiftStep, k, null);
                    notes.Add(SettingProblem.Text($"K-correction: template {t.Spectrum.Source} through observed band {t.ObservedBand.Name} to rest-frame band {rest.Name} ") +
                              SettingProblem.Text($"(references {t.ObservedReference?.Source ?? "AB"} / {t.RestReference?.Source ?? "AB"}; photon-counting responses; Hogg et al. 2002 eq. 8)."));
                }
                else
                {
                    match.ResidualK(sample, t, options.TemplateRedshiftStep, k);
                    notes.Add(SettingProblem.Text($"K-correction: residual K from matched band to target for template {t.Spectrum.Source} (Hogg et al. 2002 eq. 8; narrow bands where no curve is given)."));
                }
                return k;
            }
            default:
                throw new ArgumentOutOfRangeException(nameof(options), options.KCorrection, "unknown K-correction option");
        }
    }

    /// <summary>
    /// Fills k[i] for objects selected by <paramref name="rows"/> (null = all) with a tabulated
    /// template K-correction between <paramref name="observed"/> and <paramref name="rest"/>.
    /// </summary>
    internal static void TemplateK(CatalogueRows sample, KCorrectionOption.Template t, FilterResponse observed, FilterResponse rest,
        double step, double[] k, IReadOnlyList<int>? rows, double[]? weight = null)
    {
        TemplateKCorrection kc;
        try
        {
            kc = new TemplateKCorrection(t.Spectrum, observed, rest, t.ObservedReference, t.RestReference);
        }
        catch (ArgumentException e)
        {
            throw new InputException(e.Message, inner: e);
        }
        double zMin = double.PositiveInfinity, zMax = double.NegativeInfinity;
        int count = rows?.Count ?? sample.Count;
        if (count == 0) return;
        for (int j = 0; j < count; j++)
        {
            double z = sample.Z[rows is null ? j : rows[j]];
            zMin = Math.Min(zMin, z);
            zMax = Math.Max(zMax, z);
        }
        if (!KCorrectionGrid.TryTabulate(kc.TryEvaluate, zMin, zMax, step, out var grid, out _))
        {
            int row = 0;
            for (int j = 0; j < count; j++)
            {
                int i = rows is null ? j : rows[j];
                if (!kc.TryEvaluate(sample.Z[i], out _)) { row = i; break; }
            }
            throw new InputException(
                $"template {t.Spectrum.Source} does not cover the rest-frame wavelengths of band {observed.Name} at z = {F(sample.Z[row])} (usable for {F(kc.MinRedshift)} <= z <= {F(kc.MaxRedshift)}); extend the template or drop those objects.",
                sample.SourceName, sample.SourceRows[row], "z");
        }
        for (int j = 0; j < count; j++)
        {
            int i = rows is null ? j : rows[j];
            double w = weight?[i] ?? 1.0;
            k[i] += w * grid!.At(sample.Z[i]);
        }
    }

    private static double[]? Extinctions(CatalogueRows sample, PhotometryOptions options, BandMatchPlan? match, List<string> notes)
    {
        int n = sample.Count;
        switch (options.Extinction)
        {
            case ExtinctionOption.None:
                return null;
            case ExtinctionOption.Column c:
            {
                var col = RequireColumn(sample, c.ColumnName, "extinction");
                notes.Add(SettingProblem.Text($"Galactic extinction: per object A_band from column '{c.ColumnName}' (mag, added to the model)."));
                return (double[])col.Clone();
            }
            case ExtinctionOption.ColourExcess ce:
            {
                var ebv = RequireColumn(sample, ce.ColourExcessColumn, "E(B-V)");
                var a = new double[n];
                if (match is not null)
                    match.Extinction(sample, ebv, ce.Coefficients, a);
                else
                    for (int i = 0; i < n; i++)
                        a[i] = Coefficient(sample, options, ce.Coefficients, i) * ebv[i];
                notes.Add(SettingProblem.Text($"Galactic extinction: A_band = R_band x E(B-V) from column '{ce.ColourExcessColumn}', coefficients from {ce.Coefficients.Source}."));
                return a;
            }
            default:
                throw new ArgumentOutOfRangeException(nameof(options), options.Extinction, "unknown extinction option");
        }
    }

    private static double Coefficient(CatalogueRows sample, PhotometryOptions options, BandTable table, int i)
    {
        string band = BandOf(sample, options, i, table.Quantity);
        if (!table.TryGet(band, out double r))
            throw new InputException($"band '{band}' is not in the {table.Quantity} table {table.Source}; add it or map the band column.",
                sample.SourceName, sample.SourceRows[i], "band");
        return r;
    }

    private static string BandOf(CatalogueRows sample, PhotometryOptions options, int i, string forWhat)
    {
        if (sample.Band is { } b && !string.IsNullOrEmpty(b[i])) return b[i];
        return options.DefaultBand
               ?? throw new InputException($"{sample.SourceName}: the {forWhat} table needs each object's band; map a 'band' column or set a default band.");
    }

    private static void ApplyZeroPoints(CatalogueRows sample, PhotometryOptions options, double[] values)
    {
        if (options.ZeroPoints is not { } zp) return;
        for (int i = 0; i < values.Length; i++)
        {
            string band = BandOf(sample, options, i, zp.Quantity);
            if (!zp.TryGet(band, out double off))
                throw new InputException($"band '{band}' is not in the zero-point table {zp.Source}; add it (offset 0 for AB bands).",
                    sample.SourceName, sample.SourceRows[i], "band");
            values[i] += off;
        }
    }

    internal static double[] RequireColumn(CatalogueRows sample, string name, string forWhat, bool checkValues = true)
    {
        if (!sample.ExtraColumns.TryGetValue(name, out var col))
            throw new InputException($"the {forWhat} column '{name}' is not in the sample; keep it as an extra column when loading the catalogue.",
                sample.SourceName, column: name);
        for (int i = 0; checkValues && i < col.Length; i++)
            if (!double.IsFinite(col[i]))
                throw new InputException($"the {forWhat} value is missing or not a number.", sample.SourceName, sample.SourceRows[i], name);
        return col;
    }

    private static double[]? Copy(double[]? a) => a is null ? null : (double[])a.Clone();

    internal static string F(double x) => x.ToString("G6", Inv);
}

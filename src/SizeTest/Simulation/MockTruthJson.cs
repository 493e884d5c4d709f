using SizeTest.Inference;
using SizeTest.Cosmology;
using System.Text;
using System.Text.Json;

namespace SizeTest.Simulation;

/// <summary>
/// The truth record of a mock catalogue (<c>FILE.truth.json</c>): every setting, the seed, the random-number
/// method, and the outcome of the selection. Builds the text only; the caller writes it (atomically).
/// </summary>
/// <remarks>
/// Layout (schema_version 1): <c>synthetic</c> (always true), <c>catalog</c>, <c>command</c>, <c>seed</c>,
/// <c>random</c>, <c>world_model</c> {<c>name</c>, <c>expanding</c>, <c>parameters</c>, <c>dimming_exponent</c>},
/// <c>kind</c>, <c>population</c> (galaxy: <c>r0_kpc, size_evolution, scatter_dex, mu0, sb_evolution, scatter_mag,
/// kormendy_slope, pivot_size_kpc</c>; radio: <c>linear_size_pc, luminosity_exponent, size_evolution, scatter_dex,
/// log_lum_mean, log_lum_sd, log_lum_pivot</c>), <c>design</c> {<c>n, z_dist, z_min, z_max, errors, selection,
/// selection_mode</c>}, <c>outcome</c> {<c>drawn, passed, pass_fraction, failed_sb_limit, failed_mag_limit,
/// failed_min_size</c>}.
/// </remarks>
public static class MockTruthJson
{
    /// <summary>Serialises the truth of <paramref name="catalogue"/>.</summary>
    /// <param name="catalogue">The drawn catalogue.</param>
    /// <param name="catalogueFile">File name of the catalogue it describes (for the record), or null.</param>
    /// <param name="command">The command line that made it, or null.</param>
    public static string Serialize(MockCatalogue catalogue, string? catalogueFile = null, string? command = null)
    {
        ArgumentNullException.ThrowIfNull(catalogue);
        var spec = catalogue.Spec;
        var design = spec.Design;
        using var stream = new MemoryStream();
        using (var w = new Utf8JsonWriter(stream, new JsonWriterOptions { Indented = true, Encoder = System.Text.Encodings.Web.JavaScriptEncoder.UnsafeRelaxedJsonEscaping }))
        {
            w.WriteStartObject();
            w.WriteNumber("schema_version", 1);
            w.WriteBoolean("synthetic", true);
            w.WriteString("note", "synthetic mock catalogue drawn by SizeTest; not an observation");
            if (catalogueFile is not null) w.WriteString("catalog", catalogueFile);
            if (command is not null) w.WriteString("command", command);
            w.WriteNumber("seed", spec.Seed);
            w.WriteStartObject("random");
            w.WriteString("generator", "xoshiro256** 1.0 seeded by SplitMix64; chunk c uses stream SplitMix64(seed ^ SplitMix64(c + 0x9E3779B97F4A7C15))");
            w.WriteString("normal_deviates", "Marsaglia-Bray polar method");
            w.WriteNumber("chunk_size", MockSurveyGenerator.ChunkSize);
            w.WriteEndObject();
            w.WriteStartObject("world_model");
            w.WriteString("name", spec.Model.Name);
            w.WriteBoolean("expanding", spec.Model.IsExpanding);
            w.WriteStartObject("parameters");
            foreach (var (k, v) in spec.Model.ParameterValues) Number(w, k, v);
            w.WriteEndObject();
            Number(w, WorldModelParameters.Names.DimmingExponent, spec.Model.BolometricDimmingExponent);
            w.WriteEndObject();
            w.WriteString("kind", design.Kind == MockObjectKind.Galaxy ? "galaxy" : "radio");
            w.WriteStartObject("population");
            if (design.Kind == MockObjectKind.Galaxy)
            {
                var g = spec.GalaxyTruth;
                Number(w, NuisanceParameters.Names.R0Kpc, g.R0Kpc);
                Number(w, NuisanceParameters.Names.SizeEvolution, g.SizeEvolution);
                Number(w, NuisanceParameters.Names.ScatterDex, g.ScatterDex);
                Number(w, NuisanceParameters.Names.Mu0, g.Mu0);
                Number(w, NuisanceParameters.Names.SbEvolution, g.SbEvolution);
                Number(w, NuisanceParameters.Names.ScatterMag, g.ScatterMag);
                Number(w, NuisanceParameters.Names.KormendySlope, g.KormendySlope);
                Number(w, "pivot_size_kpc", g.PivotSizeKpc);
            }
            else
            {
                var r = spec.RadioTruth;
                Number(w, "linear_size_pc", r.LinearSizePc);
                Number(w, WorldModelParameters.Names.LuminosityExponent, r.LuminosityExponent);
                Number(w, NuisanceParameters.Names.SizeEvolution, r.SizeEvolution);
                Number(w, NuisanceParameters.Names.ScatterDex, r.ScatterDex);
                Number(w, "log_lum_mean", r.LogLuminosityMean);
                Number(w, "log_lum_sd", r.LogLuminositySd);
                Number(w, "log_lum_pivot", r.LogLuminosityPivot);
                Number(w, "r0_kpc_equivalent", r.LinearSizePc / 1000.0);
            }
            w.WriteEndObject();
            var sv = spec.SurveyTruth;
            w.WriteStartObject("survey");
            if (sv.LuminosityFunction is { } lf)
            {
                w.WriteStartObject("luminosity_function");
                w.WriteString("form", "Schechter in absolute magnitude; m = M + 5 log10(D_L/10 pc), no K-correction");
                Number(w, "m_star", lf.MStar);
                Number(w, "alpha", lf.Alpha);
                Number(w, "bright_limit", lf.BrightLimit);
                Number(w, "faint_limit", lf.FaintLimit);
                w.WriteEndObject();
                if (design.Kind == MockObjectKind.Galaxy) WriteSurfaceBrightnessFromPhotometry(w, spec);
            }
            Number(w, NuisanceParameters.Names.SizeLuminositySlope, sv.SizeLuminositySlope);
            Number(w, "pivot_abs_mag", sv.PivotAbsMag);
            Number(w, "radio_spectral_index", sv.RadioSpectralIndex);
            w.WriteStartArray("populations");
            foreach (var g in sv.Groups)
            {
                w.WriteStartObject();
                w.WriteString("name", g.Name);
                Number(w, "fraction", g.Fraction);
                Number(w, NuisanceParameters.Names.R0Kpc, g.R0Kpc);
                Number(w, NuisanceParameters.Names.SizeEvolution, g.SizeEvolution);
                Number(w, NuisanceParameters.Names.SizeLuminositySlope, g.SizeLuminositySlope);
                Number(w, NuisanceParameters.Names.ScatterDex, g.ScatterDex);
                if (sv.LuminosityFunction is not null)
                {
                    var implied = PhotometricSurfaceBrightness.For(spec.Model, sv.PivotAbsMag, g.R0Kpc, g.SizeEvolution, g.SizeLuminositySlope, g.ScatterDex);
                    Number(w, NuisanceParameters.Names.Mu0, implied.Mu0);
                    Number(w, NuisanceParameters.Names.SbEvolution, implied.SbEvolution);
                    Number(w, NuisanceParameters.Names.SbLuminositySlope, implied.SbLuminositySlope);
                    Number(w, NuisanceParameters.Names.ScatterMag, implied.ScatterMag);
                }
                w.WriteEndObject();
            }
            w.WriteEndArray();
            w.WriteEndObject();
            w.WriteStartObject("design");
            w.WriteNumber("n", design.Count);
            w.WriteString("z_dist", design.Redshifts.Text);
            Number(w, "z_min", design.Redshifts.ZMin);
            Number(w, "z_max", design.Redshifts.ZMax);
            var e = design.MeasurementErrors;
            w.WriteStartObject("errors");
            Number(w, "size_err_frac", e.SizeErrorFraction);
            Number(w, "size_err_floor_arcsec", e.SizeErrorFloorArcsec);
            Number(w, "mu_err_mag", e.MuErrorMag);
            Number(w, "photoz_err", e.PhotoZError);
            NullableNumber(w, "size_err_frac_at_zmax", e.SizeErrorFractionAtZMax);
            w.WriteString("size_error_model", e.SizeErrors == SizeErrorModel.Gaussian
                ? "gaussian: theta_obs = theta_true + theta_err eps, theta_err = frac * median theta at z (pivot luminosity); theta_obs <= 0 counted as failed_min_size"
                : e.SizeErrors == SizeErrorModel.GaussianOwnSize
                ? "gaussian-own: theta_obs = theta_true + theta_err eps, theta_err = frac * theta_true of the object; theta_obs <= 0 counted as failed_min_size"
                : "log-normal: ln theta_obs = ln theta_true + sigma_ln eps, sigma_ln = sqrt(frac^2 + (floor/median theta at z (pivot luminosity))^2); theta_err = sigma_ln theta_obs");
            w.WriteEndObject();
            var s = design.Cuts;
            w.WriteStartObject("selection");
            NullableNumber(w, "sb_limit", s.SbLimit);
            NullableNumber(w, "mag_limit", s.MagLimit);
            NullableNumber(w, "min_size_arcsec", s.MinThetaArcsec);
            w.WriteEndObject();
            w.WriteString("selection_mode", "applied to observed values; objects drawn until n pass");
            w.WriteEndObject();
            w.WriteStartObject("outcome");
            w.WriteNumber("drawn", catalogue.Drawn);
            w.WriteNumber("passed", catalogue.Count);
            Number(w, "pass_fraction", catalogue.PassFraction);
            w.WriteNumber("failed_sb_limit", catalogue.FailedSbLimit);
            w.WriteNumber("failed_mag_limit", catalogue.FailedMagLimit);
            w.WriteNumber("failed_min_size", catalogue.FailedMinSize);
            w.WriteEndObject();
            if (catalogue.ZErr is not null)
            {
                // Photometric redshifts: the true redshift of every catalogue row, in row order.
                w.WriteStartArray("z_true");
                foreach (var z in catalogue.ZTrue) w.WriteNumberValue(z);
                w.WriteEndArray();
            }
            w.WriteEndObject();
        }
        return Encoding.UTF8.GetString(stream.ToArray()) + "\n";
    }

    // With a luminosity function μ follows from the photometry: the SB parameters it implies (PhotometricSurfaceBrightness).
    private static void WriteSurfaceBrightnessFromPhotometry(Utf8JsonWriter w, MockSurveySpec spec)
    {
        var g = spec.GalaxyTruth;
        var sv = spec.SurveyTruth;
        var implied = PhotometricSurfaceBrightness.For(spec.Model, sv.PivotAbsMag, g.R0Kpc, g.SizeEvolution, sv.SizeLuminositySlope, g.ScatterDex);
        w.WriteStartObject("surface_brightness_from_photometry");
        w.WriteString("rule", "mu = m + 5 log10 theta_obs + 2.5 log10(2 pi) + mu_err noise: population.mu0, sb_evolution, scatter_mag and kormendy_slope are not used; " +
                              "the values below are what a joint fit with the size-luminosity relation, the generating world model and no size-SB slope should find");
        Number(w, NuisanceParameters.Names.Mu0, implied.Mu0);
        Number(w, NuisanceParameters.Names.SbEvolution, implied.SbEvolution);
        Number(w, NuisanceParameters.Names.SbLuminositySlope, implied.SbLuminositySlope);
        Number(w, NuisanceParameters.Names.ScatterMag, implied.ScatterMag);
        w.WriteEndObject();
    }

    private static void Number(Utf8JsonWriter w, string name, double v)
    {
        if (double.IsFinite(v)) w.WriteNumber(name, v);
        else w.WriteNull(name);
    }

    private static void NullableNumber(Utf8JsonWriter w, string name, double? v)
    {
        if (v is { } x) Number(w, name, x);
        else w.WriteNull(name);
    }
}

using SizeTest.Foundation.Errors;

namespace SizeTest.Studies;

/// <summary>
/// The study file's spelling of a setting named by an inner stage (<see cref="SettingProblem"/>, e.g. <c>{sb_limit}</c>):
/// the key a study author writes (<c>selection.sb_limit</c>; docs/study-file.md). A setting the study file has no key of
/// its own for keeps its name.
/// </summary>
internal static class StudySettingKeys
{
    /// <summary>The study-file key of <paramref name="setting"/>, or the setting itself when the study file has no key for it.</summary>
    public static string Key(string setting) => KeyOrNull(setting) ?? setting;

    /// <summary>The study-file key of <paramref name="setting"/>, or null when the study file has no key for it (a setting of
    /// the command line that runs the study, such as <c>{out}</c>, or one a study cannot set).</summary>
    public static string? KeyOrNull(string setting) => setting switch
    {
        "observable" => "models.observable",
        "size_sb_relation" or "grid_nodes" or "pivot_kpc" or "dimming_offset" => "models." + setting,
        "models" => "models.names",
        "flux_convention" => "models.flux_convention",
        "sb_limit" or "mag_limit" or "min_size" => "selection." + setting,
        "max_outside_selection" => "selection.max_outside_fraction",
        "col" => "[columns]",
        "size_def" => "catalogue.size_definition",
        "hdu" => "catalogue.table",
        "catalog_format" => "catalogue.format",
        "keep" => "catalogue.keep",
        "kcorr" or "extinction" or "zero_points" or "band" or "band_match" or "sersic_n" or "sb" => "corrections." + setting,
        "z_marginal" or "z_nodes" => "survey." + setting,
        "group" or "evolution" or "z_prior" or "z_prior_shape" or "abs_mag_range" or "size_errors" or "ignore_z_err" => "survey." + setting,
        "pivot_abs_mag" or "pivot_log_mass" or "pivot_log_lum" or "frequency_ghz" or "spectral_index" or "ref_cosmology" => "survey." + setting,
        "size_luminosity" => "survey.size_relation = \"luminosity\"",
        "size_mass" => "survey.size_relation = \"mass\"",
        "starts" or "bootstrap" or "cv_folds" or "sampler" => "inference." + setting,
        "steps" => "inference.sampler_steps",
        "max_steps" => "inference.sampler_max_steps",
        "walkers" => "inference.sampler_walkers",
        "expect" => "[expected]",
        _ => null,
    };

    /// <summary>A note or warning from an inner stage with every setting written as its study-file key.</summary>
    public static string Text(string text) => SettingProblem.RenderText(text, Key);

    /// <summary>An error of an inner stage during a study run with the settings the study file has keys for written as
    /// those keys; the others (the run command's own, such as <c>{out}</c>) are left to the command line.</summary>
    public static Exception Respelled(Exception e) => e switch
    {
        InputException ie => ie.Respelled(KeyOrNull),
        AnalysisException ae => ae.Respelled(KeyOrNull),
        _ => e,
    };
}

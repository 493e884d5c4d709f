using SizeTest.Foundation.Errors;

namespace SizeTest.Studies;

/// <summary>
/// The study file's spelling of a setting named by an inner stage (<see cref="SettingProblem"/>, e.g. <c>{sb_limit}</c>):
/// the key a study author writes (<c>selection.sb_limit</c>; docs/study-file.md). A setting the study file has no key of
/// its own for keeps its name.
/// </summary>
internal static class StudySettingKeys
{
    /// <summary>The study-file key of <paramref name="setting"/>.</summary>
    public static string Key(string setting) => setting switch
    {
        "observable" => "models.observable",
        "size_sb_relation" => "models.size_sb_relation",
        "sb_limit" or "mag_limit" or "min_size" => "selection." + setting,
        "max_outside_selection" => "selection.max_outside_fraction",
        "col" => "[columns]",
        "size_def" => "catalogue.size_definition",
        "z_marginal" or "z_nodes" => "survey." + setting,
        "group" or "evolution" or "z_prior" or "z_prior_shape" or "abs_mag_range" or "size_errors" or "ignore_z_err" => "survey." + setting,
        "size_luminosity" => "survey.size_relation = \"luminosity\"",
        "size_mass" => "survey.size_relation = \"mass\"",
        "expect" => "[expected]",
        _ => setting,
    };

    /// <summary>A note or warning from an inner stage with every setting written as its study-file key.</summary>
    public static string Text(string text) => SettingProblem.RenderText(text, Key);
}

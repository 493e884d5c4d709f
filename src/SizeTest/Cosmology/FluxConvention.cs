using System.Globalization;
using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Text;

namespace SizeTest.Cosmology;

/// <summary>
/// The flux convention of a static world model (<see cref="StaticEuclideanModel"/>): how its luminosity distance follows
/// from its distance d, D_L = d (1+z)^q, with q the parameter <c>luminosity_exponent</c> (docs/science.md §1.5).
/// </summary>
/// <remarks>
/// <para>D_L is defined by F = L/(4π D_L²). In a static Euclidean space the light of a source at distance d spreads over
/// 4π d²; each photon arrives with its energy divided by (1+z).</para>
/// <list type="bullet">
/// <item><see cref="EnergyLoss"/>: photons only lose energy, so F = L/[4π d² (1+z)], hence D_L² = d² (1+z) and q = 1/2
/// (the convention of Lerner, Falomo &amp; Scarpa 2014, IJMPD 23, 1450058, for a static Euclidean universe with a linear
/// Hubble law); the bolometric surface brightness then dims as (1+z)^−1.</item>
/// <item><see cref="TimeDilation"/>: the photon arrival rate is diluted by (1+z) as well, so F = L/[4π d² (1+z)²], hence
/// D_L = d (1+z) and q = 1 (common practice for tired-light variants); dimming (1+z)^−2.</item>
/// </list>
/// </remarks>
public enum FluxConvention
{
    /// <summary>Energy loss only: D_L = d (1+z)^{1/2} (q = 0.5, the default).</summary>
    EnergyLoss,
    /// <summary>Energy loss and time dilation of the arrival rate: D_L = d (1+z) (q = 1).</summary>
    TimeDilation,
}

/// <summary>The spellings of <see cref="FluxConvention"/> ("energy-loss", "time-dilation") and what each sets.</summary>
public static class FluxConventions
{
    /// <summary>The setting that chooses the convention (a flag or study key in the front ends).</summary>
    public const string Setting = "flux_convention";

    /// <summary>How a fitted model's convention is reported when <c>luminosity_exponent</c> is free.</summary>
    public const string FittedLabel = "fitted";

    /// <summary>How it is reported when <c>luminosity_exponent</c> is fixed at a value neither convention has.</summary>
    public const string OtherLabel = "other";

    /// <summary>The one spelling of each value.</summary>
    public static Spellings<FluxConvention> Spellings { get; } = new("flux convention", [(FluxConvention.EnergyLoss, "energy-loss"), (FluxConvention.TimeDilation, "time-dilation")]);

    /// <summary>The spellings, in display order.</summary>
    public static IReadOnlyList<string> Names => Spellings.Names;

    /// <summary>The spelling of <paramref name="convention"/>.</summary>
    public static string Name(this FluxConvention convention) => Spellings.Name(convention);

    /// <summary>The value spelt <paramref name="name"/> (exact, lower case), or false.</summary>
    public static bool TryParse(string? name, out FluxConvention convention) => Spellings.TryParse(name, out convention);

    /// <summary>q in D_L = d (1+z)^q: 1/2 for energy loss only, 1 with time dilation (derivation in <see cref="FluxConvention"/>).</summary>
    public static double LuminosityExponent(this FluxConvention convention) => convention switch
    {
        FluxConvention.EnergyLoss => 0.5,
        FluxConvention.TimeDilation => 1.0,
        _ => throw new ArgumentOutOfRangeException(nameof(convention), convention, null),
    };

    /// <summary>The convention whose q is exactly <paramref name="luminosityExponent"/>, or null.</summary>
    public static FluxConvention? Of(double luminosityExponent) =>
        luminosityExponent == 0.5 ? FluxConvention.EnergyLoss : luminosityExponent == 1.0 ? FluxConvention.TimeDilation : null;

    /// <summary>Whether <paramref name="family"/> takes a flux convention (it has the parameter <c>luminosity_exponent</c>).</summary>
    public static bool Applies(IWorldModelFamily family)
    {
        ArgumentNullException.ThrowIfNull(family);
        return family.Parameters.Any(p => p.Name == WorldModelParameters.Names.LuminosityExponent);
    }

    /// <summary>The families that take a flux convention, by name (the static ones).</summary>
    public static IReadOnlyList<string> StaticFamilyNames { get; } = WorldModels.All.Where(Applies).Select(f => f.Name).ToArray();

    /// <summary>
    /// The problem when a convention was given but none of <paramref name="families"/> takes one (names the setting
    /// <c>{flux_convention}</c> and <paramref name="listSetting"/>, the setting that lists the models), else null.
    /// </summary>
    public static SettingProblem? Unused(IEnumerable<IWorldModelFamily> families, string listSetting)
    {
        ArgumentNullException.ThrowIfNull(families);
        var list = families.ToArray();
        if (list.Any(Applies)) return null;
        return new SettingProblem($"{SettingProblem.Name(Setting)} applies only to static world models ({string.Join(", ", StaticFamilyNames)}); {SettingProblem.Name(listSetting)} lists {string.Join(", ", list.Select(f => f.Name))}");
    }

    /// <summary>
    /// The label of a static model's convention in result files: the convention's spelling when q is one of theirs,
    /// <see cref="OtherLabel"/> for another fixed q, <see cref="FittedLabel"/> when q is free.
    /// </summary>
    public static string Label(double luminosityExponent, bool free) =>
        free ? FittedLabel : Of(luminosityExponent)?.Name() ?? OtherLabel;

    /// <summary>The convention in words for reports, e.g. "energy-loss, D_L = d (1+z)^0.5 (photons lose energy only, …)".</summary>
    public static string Words(double luminosityExponent, bool free)
    {
        if (free) return "fitted, D_L = d (1+z)^q with q = luminosity_exponent free";
        string q = luminosityExponent.ToString("0.###", CultureInfo.InvariantCulture);
        string law = luminosityExponent == 1.0 ? "D_L = d (1+z)" : $"D_L = d (1+z)^{q}";
        return Of(luminosityExponent) switch
        {
            FluxConvention.EnergyLoss => $"energy-loss, {law} (photons lose energy only, F = L/[4π d² (1+z)])",
            FluxConvention.TimeDilation => $"time-dilation, {law} (energy loss and a diluted arrival rate, F = L/[4π d² (1+z)²])",
            _ => $"{law} (luminosity_exponent fixed at {q}, neither energy-loss nor time-dilation)",
        };
    }
}

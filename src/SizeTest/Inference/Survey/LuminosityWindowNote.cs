using System.Globalization;
using SizeTest.Foundation.Errors;

namespace SizeTest.Inference.Survey;

/// <summary>
/// What the results say of a luminosity window (<see cref="SurveyModel.HasWindow"/>): how many objects each world model keeps
/// (M = m − 5 log₁₀(D_L/10 pc) − K under its own D_L, at its start parameters), counted over the whole sample, and the error when
/// a model keeps none. One wording for one process and for a sample split over MPI ranks.
/// </summary>
public static class LuminosityWindowNote
{
    /// <summary>The note for world model <paramref name="family"/>: <paramref name="kept"/> of <paramref name="total"/> objects inside.</summary>
    public static string Text(long kept, long total, SurveyModel window, string family)
    {
        ArgumentNullException.ThrowIfNull(window);
        return $"luminosity window: {kept} of {total} objects have M in [{window.AbsMagMin?.ToString("G4", CultureInfo.InvariantCulture) ?? "-inf"}, {window.AbsMagMax?.ToString("G4", CultureInfo.InvariantCulture) ?? "+inf"}] under {family} (its own D_L, at its start parameters); the others do not enter its likelihood, so its n differs from other models'.";
    }

    /// <summary>The error when world model <paramref name="family"/> keeps no object of the whole sample.</summary>
    public static InputException NoneInside(string family) =>
        SettingProblem.Exception([new($"no object of the sample lies in {{abs_mag_range}} under world model '{family}'")]);
}

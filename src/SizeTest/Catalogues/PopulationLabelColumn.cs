using System.Globalization;
using SizeTest.Foundation.Errors;

namespace SizeTest.Catalogues;

/// <summary>
/// A column that looks like a population label (a morphological type, a class, a star-forming/quiescent flag) with a few
/// well-filled labels, found while loading a catalogue whose user did not ask for populations: it could be fitted as
/// separate populations with the group setting. Found by <see cref="PopulationLabelColumns"/>.
/// </summary>
/// <param name="Column">The column's name.</param>
/// <param name="Reason">Why it looks like a population label (<c>named like a population label</c>, <c>UCD src.morph.type</c>).</param>
/// <param name="Labels">Each distinct label and its number of accepted rows, in ordinal label order.</param>
/// <param name="Unlabelled">Accepted rows whose cell is empty or unreadable (a group fit would reject them).</param>
public sealed record PopulationLabelColumn(string Column, string Reason, IReadOnlyList<(string Label, long Count)> Labels, long Unlabelled)
{
    /// <summary>
    /// The note shown by <c>inspect</c> and <c>fit</c>, naming the group setting as <c>{group}</c>
    /// (<see cref="SettingProblem.RenderText"/>); the column name and labels are escaped.
    /// </summary>
    public string Note
    {
        get
        {
            string labels = string.Join(", ", Labels.Select(l => $"'{l.Label}' {l.Count.ToString(CultureInfo.InvariantCulture)}"));
            string unlabelled = Unlabelled == 0 ? ""
                : SettingProblem.Text($" ({Unlabelled.ToString(CultureInfo.InvariantCulture)} accepted rows have no label; a group fit would reject them)");
            return SettingProblem.Text($"possible populations: column '{Column}' ({Reason}) holds {Labels.Count.ToString(CultureInfo.InvariantCulture)} labels among the accepted rows: {labels}")
                   + unlabelled
                   + SettingProblem.Text($"; they could be fitted as separate populations (each with its own nuisance parameters, the world model shared) with {{group}} {Column}");
        }
    }
}

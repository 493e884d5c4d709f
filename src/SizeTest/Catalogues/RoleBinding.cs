using SizeTest.Foundation.Errors;

namespace SizeTest.Catalogues;

/// <summary>How one role is read from the catalogue, and why.</summary>
/// <param name="Role">The role.</param>
/// <param name="ColumnIndex">Index into the reader's columns.</param>
/// <param name="ColumnName">The column's name.</param>
/// <param name="Unit">The unit the column is read in (canonical spelling, e.g. <c>arcsec</c>, <c>mag/arcsec2</c>, <c>frac</c>); empty for dimensionless roles.</param>
/// <param name="Scale">Factor applied to each value: radians per unit for angles; for relative errors the fraction per unit (1 for <c>frac</c>, 0.01 for <c>%</c>); 1 otherwise.</param>
/// <param name="IsRelative">True when the error is relative to its value (absolute error = value × Scale × cell).</param>
/// <param name="Reason">Why this column: <c>given with {col}</c>, <c>named by role</c>, <c>UCD …</c>, <c>common name for …</c>, <c>error companion of …</c>.</param>
/// <param name="UnitReason">Where the unit came from: <c>given</c>, <c>from the file</c>, <c>default</c>, <c>same as theta</c>.</param>
public sealed record RoleBinding(ColumnRole Role, int ColumnIndex, string ColumnName, string Unit, double Scale, bool IsRelative, string Reason, string UnitReason)
{
    /// <summary>One line for reports: <c>theta ← Re [arcsec, from the file] (because UCD phys.angSize;src)</c>.</summary>
    public string Describe() =>
        $"{Role.Name(),-9} ← {SettingProblem.Literal(ColumnName)}{(Unit.Length > 0 ? $" [{SettingProblem.Literal(Unit)}, {UnitReason}]" : "")} (because {Reason})";
}

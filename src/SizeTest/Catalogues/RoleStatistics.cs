namespace SizeTest.Catalogues;

/// <summary>Summary of one role over the accepted rows (for <c>inspect</c>).</summary>
/// <param name="Role">The role.</param>
/// <param name="Column">The column it came from.</param>
/// <param name="Unit">Unit of <see cref="Min"/>/<see cref="Median"/>/<see cref="Max"/>: arcsec for angles, mag/arcsec2, mag, empty for z.</param>
/// <param name="Count">Accepted values.</param>
/// <param name="NullCount">Null cells of this column among the accepted rows (a rejected row's null is in the reject log).</param>
/// <param name="Min">Smallest accepted value (NaN if none; also for text roles).</param>
/// <param name="Median">Median accepted value (mean of the two middle values for an even count).</param>
/// <param name="Max">Largest accepted value.</param>
public sealed record RoleStatistics(ColumnRole Role, string Column, string Unit, int Count, long NullCount, double Min, double Median, double Max);

namespace SizeTest.Reporting.Rendering;

/// <summary>One tick on an axis, at a position in drawn (possibly log10) coordinates.</summary>
/// <param name="Position">Position in drawn coordinates (log10 of the value on a log axis).</param>
/// <param name="Label">Label text (empty for minor ticks).</param>
/// <param name="Major">Major ticks carry labels and longer marks.</param>
public readonly record struct AxisTick(double Position, string Label, bool Major);

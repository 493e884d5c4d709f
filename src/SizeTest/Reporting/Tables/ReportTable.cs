namespace SizeTest.Reporting.Tables;

/// <summary>
/// A table as plain text cells, shared by the HTML and PDF reports and written to the figure
/// pack as CSV and LaTeX. Numbers are already formatted (invariant culture) so every output
/// shows the same digits.
/// </summary>
/// <param name="Id">File stem (e.g. <c>parameters</c>).</param>
/// <param name="Title">Caption heading.</param>
/// <param name="Columns">Column headings.</param>
/// <param name="Rows">Rows, each with one cell per column.</param>
public sealed record ReportTable(string Id, string Title, IReadOnlyList<string> Columns, IReadOnlyList<IReadOnlyList<string>> Rows)
{
    /// <summary>Caption text under the heading.</summary>
    public string Caption { get; init; } = "";

    /// <summary>Machine column names for CSV (default: <see cref="Columns"/>).</summary>
    public IReadOnlyList<string>? MachineColumns { get; init; }

    /// <summary>Full-precision cells for CSV (default: <see cref="Rows"/>, which are rounded for people).</summary>
    public IReadOnlyList<IReadOnlyList<string>>? MachineRows { get; init; }

    /// <summary>Text shown instead of the table when it has no rows (e.g. "No row was rejected.").</summary>
    public string EmptyText { get; init; } = "";
}

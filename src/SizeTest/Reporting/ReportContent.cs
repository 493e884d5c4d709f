using SizeTest.Reporting.Data;
using SizeTest.Reporting.Figures;
using SizeTest.Reporting.Tables;

namespace SizeTest.Reporting;

/// <summary>
/// Everything a report shows, assembled once from <see cref="ReportData"/> and shared by the
/// HTML writer, the PDF writer and the figure pack: the data, the figure records, the tables and
/// the conclusions in words.
/// </summary>
/// <param name="Data">The input data.</param>
/// <param name="Figures">Figure records in report order.</param>
/// <param name="Tables">Tables in report order.</param>
/// <param name="Conclusions">Conclusions in words.</param>
public sealed record ReportContent(ReportData Data, IReadOnlyList<FigureSpec> Figures, IReadOnlyList<ReportTable> Tables, IReadOnlyList<string> Conclusions)
{
    /// <summary>Builds figures, tables and conclusions from <paramref name="data"/>.</summary>
    public static ReportContent From(ReportData data, FigureOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(data);
        return new ReportContent(data, ReportFigures.Build(data, options), ReportTables.All(data), ReportConclusions.Derive(data));
    }

    /// <summary>The table with the given id.</summary>
    public ReportTable Table(string id) => Tables.First(t => t.Id == id);
}

using SizeTest.Inference;
using SizeTest.Reporting.Data;

namespace SizeTest.Studies;

/// <summary>What a study run produced.</summary>
/// <param name="Result">The fit study's result (results.json).</param>
/// <param name="Report">The report data (report-data.json).</param>
/// <param name="OutputDirectory">The folder written.</param>
/// <param name="Files">Relative paths of every file written, sorted.</param>
public sealed record StudyRunOutcome(FitResult Result, ReportData Report, string OutputDirectory, IReadOnlyList<string> Files);

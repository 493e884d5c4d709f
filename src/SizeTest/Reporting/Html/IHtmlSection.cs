using System.Text;

namespace SizeTest.Reporting.Html;

/// <summary>
/// One section of the HTML report. The report is an ordered list of these
/// (<see cref="HtmlReportWriter.DefaultSections"/>); add a section by implementing this and
/// inserting it into the list.
/// </summary>
public interface IHtmlSection
{
    /// <summary>Anchor id of the section (also its <c>data-section</c> attribute).</summary>
    string Id { get; }

    /// <summary>Heading shown in the page and the table of contents.</summary>
    string Heading { get; }

    /// <summary>Appends the section body (without the heading) as HTML; text must be escaped with <see cref="Html.Text"/>.</summary>
    void WriteBody(StringBuilder html, ReportContent content);
}

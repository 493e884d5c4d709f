using System.Net;
using System.Text;
using SizeTest.Reporting.Tables;

namespace SizeTest.Reporting.Html;

/// <summary>Escaping and small building blocks for the HTML report.</summary>
public static partial class Html
{
    /// <summary>HTML-escapes text.</summary>
    public static string Text(string s) => WebUtility.HtmlEncode(s);

    /// <summary>Appends one escaped <c>&lt;li&gt;</c> line per item (the list's own tags are the caller's).</summary>
    public static void Items(StringBuilder sb, IEnumerable<string> items)
    {
        foreach (var item in items) sb.Append("<li>").Append(Text(item)).Append("</li>\n");
    }

    /// <summary>Appends a table with a caption.</summary>
    public static void Table(StringBuilder sb, ReportTable t)
    {
        if (t.Rows.Count == 0 && t.EmptyText.Length > 0)
        {
            sb.Append("<p id=\"table-").Append(Text(t.Id)).Append("\">").Append(Text(t.EmptyText)).Append("</p>\n");
            return;
        }
        sb.Append("<table id=\"table-").Append(Text(t.Id)).Append("\"><caption><strong>").Append(Text(t.Title)).Append(".</strong> ").Append(Text(t.Caption)).Append("</caption>\n<thead><tr>");
        for (int j = 0; j < t.Columns.Count; j++)
        {
            bool numeric = t.Rows.Count > 0 && t.Rows.All(r => r[j].Length == 0 || IsNumber(r[j]));
            sb.Append(numeric ? "<th class=\"num\">" : "<th>").Append(Text(t.Columns[j])).Append("</th>");
        }
        sb.Append("</tr></thead>\n<tbody>\n");
        foreach (var r in t.Rows)
        {
            sb.Append("<tr>");
            foreach (var c in r) sb.Append(IsNumber(c) ? "<td class=\"num\">" : "<td>").Append(Text(c)).Append("</td>");
            sb.Append("</tr>\n");
        }
        sb.Append("</tbody></table>\n");
    }

    /// <summary>Appends a two-column key/value table.</summary>
    public static void KeyValues(StringBuilder sb, string cssClass, IEnumerable<(string Key, string Value)> rows)
    {
        sb.Append("<table class=\"").Append(cssClass).Append("\"><tbody>\n");
        foreach (var (k, v) in rows) sb.Append("<tr><th scope=\"row\">").Append(Text(k)).Append("</th><td>").Append(Text(v)).Append("</td></tr>\n");
        sb.Append("</tbody></table>\n");
    }

    private static bool IsNumber(string s) => IsNumeric(s);

    /// <summary>True for a number as people read it: "−1.02", "1.02 ± 0.03", "1.0 +0.2 −0.1", "3.5e−4".</summary>
    public static bool IsNumeric(string s) => NumericCell().IsMatch(s);

    [System.Text.RegularExpressions.GeneratedRegex(@"^[−+-]?(\d+\.?\d*|\.\d+)([eE][−+-]?\d+)?( ± \d+\.?\d*| \+\d+\.?\d* −\d+\.?\d*)?$")]
    private static partial System.Text.RegularExpressions.Regex NumericCell();
}

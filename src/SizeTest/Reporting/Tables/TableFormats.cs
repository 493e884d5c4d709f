using System.Text;

namespace SizeTest.Reporting.Tables;

/// <summary>CSV (RFC 4180) and LaTeX <c>tabular</c> versions of a <see cref="ReportTable"/>.</summary>
public static class TableFormats
{
    /// <summary>CSV with a header row, LF line ends, fields quoted when they hold a comma, quote or line break.</summary>
    public static string ToCsv(ReportTable table)
    {
        var sb = new StringBuilder();
        sb.Append(string.Join(',', (table.MachineColumns ?? table.Columns).Select(Csv))).Append('\n');
        foreach (var r in table.MachineRows ?? table.Rows) sb.Append(string.Join(',', r.Select(Csv))).Append('\n');
        return sb.ToString();
    }

    private static string Csv(string s) =>
        s.IndexOfAny([',', '"', '\n', '\r']) >= 0 ? "\"" + s.Replace("\"", "\"\"") + "\"" : s;

    /// <summary>A LaTeX <c>tabular</c> (booktabs rules) with special characters escaped; numbers right-aligned.</summary>
    public static string ToLatex(ReportTable table)
    {
        var align = string.Concat(table.Columns.Select((_, j) => table.Rows.Count > 0 && table.Rows.All(r => r[j].Length == 0 || Html.Html.IsNumeric(r[j])) ? "r" : "l"));
        var sb = new StringBuilder();
        sb.Append("% ").Append(table.Title).Append(" (SizeTest; needs \\usepackage{booktabs})\n");
        sb.Append("\\begin{tabular}{").Append(align).Append("}\n\\toprule\n");
        sb.Append(string.Join(" & ", table.Columns.Select(Tex))).Append(" \\\\\n\\midrule\n");
        foreach (var r in table.Rows) sb.Append(string.Join(" & ", r.Select(Tex))).Append(" \\\\\n");
        sb.Append("\\bottomrule\n\\end{tabular}\n");
        return sb.ToString();
    }

    /// <summary>Escapes LaTeX special characters and maps common Unicode symbols to math mode.</summary>
    public static string Tex(string s)
    {
        var sb = new StringBuilder();
        foreach (var c in s)
        {
            sb.Append(c switch
            {
                '\\' => "\\textbackslash{}",
                '&' or '%' or '$' or '#' or '_' or '{' or '}' => "\\" + c,
                '~' => "\\textasciitilde{}",
                '^' => "\\textasciicircum{}",
                'Ω' => "$\\Omega$",
                'Λ' => "$\\Lambda$",
                'χ' => "$\\chi$",
                '²' => "$^2$",
                '≥' => "$\\geq$",
                '≤' => "$\\leq$",
                '<' => "$<$",
                '>' => "$>$",
                'Δ' => "$\\Delta$",
                'θ' => "$\\theta$",
                'μ' => "$\\mu$",
                'σ' => "$\\sigma$",
                '−' => "$-$",
                '±' => "$\\pm$",
                _ => c.ToString(),
            });
        }
        return sb.ToString();
    }
}

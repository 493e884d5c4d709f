using System.Globalization;
using System.Text;
using SizeTest.Reporting.Rendering;

namespace SizeTest.Reporting.Html;

/// <summary>The verdict first: one summary table and a handful of sentences.</summary>
public sealed class VerdictSection : IHtmlSection
{
    /// <inheritdoc />
    public string Id => "verdict";
    /// <inheritdoc />
    public string Heading => "Verdict";
    /// <inheritdoc />
    public void WriteBody(StringBuilder html, ReportContent content)
    {
        Html.Table(html, content.Table("summary"));
        html.Append("<ul class=\"verdict\">\n");
        Html.Items(html, content.Conclusions);
        html.Append("</ul>\n");
    }
}

/// <summary>Job summary: what was run, with which build and seed.</summary>
public sealed class JobSummarySection : IHtmlSection
{
    /// <inheritdoc />
    public string Id => "job-summary";
    /// <inheritdoc />
    public string Heading => "Job summary";
    /// <inheritdoc />
    public void WriteBody(StringBuilder html, ReportContent content)
    {
        var j = content.Data.Job;
        Html.KeyValues(html, "kv", [
            ("study file", j.StudyFile.Length > 0 ? j.StudyFile : "(none)"),
            ("catalogue", j.Catalogue + (j.Synthetic ? " (synthetic)" : "")),
            ("models", string.Join(", ", content.Data.Models.Select(m => m.Label))),
            ("method", j.Method.Length > 0 ? j.Method : "(not stated)"),
            ("SizeTest", j.SizeTestVersion + (j.GitCommit.Length > 0 ? $" (commit {j.GitCommit})" : "")),
            ("seed", j.Seed.ToString(CultureInfo.InvariantCulture)),
        ]);
    }
}

/// <summary>Data summary: rows read, accepted and rejected, and why.</summary>
public sealed class DataSummarySection : IHtmlSection
{
    /// <inheritdoc />
    public string Id => "data-summary";
    /// <inheritdoc />
    public string Heading => "Data";
    /// <inheritdoc />
    public void WriteBody(StringBuilder html, ReportContent content)
    {
        var d = content.Data.Data;
        Html.KeyValues(html, "kv", [
            ("rows read", d.RowsRead.ToString(CultureInfo.InvariantCulture)),
            ("accepted", d.Accepted.ToString(CultureInfo.InvariantCulture)),
            ("rejected", d.Rejected.ToString(CultureInfo.InvariantCulture) + (d.Balanced ? "" : " (does not add up: rows read ≠ accepted + rejected)")),
            ("size definition", d.SizeDefinition.Length > 0 ? d.SizeDefinition : "(not stated)"),
            ("band", d.Band.Length > 0 ? d.Band : "(not stated)"),
        ]);
        Html.Table(html, content.Table("rejects"));
    }
}

/// <summary>Conclusions with the assumptions they rest on beside them, and the caution on information criteria.</summary>
public sealed class ConclusionsSection : IHtmlSection
{
    /// <inheritdoc />
    public string Id => "conclusions";
    /// <inheritdoc />
    public string Heading => "Evolution tests and the assumptions they rest on";

    /// <summary>Heading of the power conclusion (HTML and PDF).</summary>
    public const string PowerHeading = "Power of this design";
    /// <inheritdoc />
    public void WriteBody(StringBuilder html, ReportContent content)
    {
        Html.Table(html, content.Table("evolution-tests"));
        html.Append("<div class=\"pair\">\n<div class=\"conclusions\"><h3>What the tests say</h3><ul>\n");
        Html.Items(html, ReportConclusions.Statements(content.Data));
        html.Append("</ul>\n");
        if (content.Data.ExtraConclusions.Count > 0)
        {
            html.Append("<h3>Notes</h3><ul>\n");
            Html.Items(html, content.Data.ExtraConclusions);
            html.Append("</ul>\n");
        }
        if (content.Data.Power is { Statement.Length: > 0 } power)
        {
            // The power conclusion beside the assumptions of the mocks it comes from.
            html.Append("<div class=\"power\" id=\"power\"><h3>").Append(Html.Text(PowerHeading)).Append("</h3>\n<p>").Append(Html.Text(power.Statement)).Append("</p>\n");
            if (power.Assumptions.Count > 0)
            {
                html.Append("<p>It assumes:</p><ul>\n");
                Html.Items(html, power.Assumptions);
                html.Append("</ul>\n");
            }
            html.Append("</div>\n");
        }
        html.Append("</div>\n<div class=\"assumptions\"><h3>Assumptions</h3><dl>\n");
        foreach (var a in content.Data.Assumptions)
            html.Append("<dt>").Append(Html.Text(a.Topic)).Append("</dt><dd>").Append(Html.Text(a.Statement)).Append("</dd>\n");
        if (content.Data.Assumptions.Count == 0) html.Append("<dt>none stated</dt><dd>The study stated no assumptions; read every conclusion with that in mind.</dd>\n");
        html.Append("</dl></div>\n</div>\n<p class=\"caution\"><strong>Caution.</strong> ").Append(Html.Text(ReportConclusions.Caution)).Append("</p>\n");
    }
}

/// <summary>Parameter and criteria tables.</summary>
public sealed class TablesSection : IHtmlSection
{
    /// <inheritdoc />
    public string Id => "tables";
    /// <inheritdoc />
    public string Heading => "Parameters and model comparison";
    /// <inheritdoc />
    public void WriteBody(StringBuilder html, ReportContent content)
    {
        Html.Table(html, content.Table("parameters"));
        Html.Table(html, content.Table("comparison"));
        foreach (var t in content.Tables.Where(t => t.Id is Tables.ResamplingTables.BootstrapId or Tables.ResamplingTables.CrossValidationId))
        {
            Html.Table(html, t);
            if (Tables.ResamplingTables.Sentence(content.Data, t.Id) is { } said) html.Append("<p class=\"resampling\" id=\"says-").Append(t.Id).Append("\">").Append(Html.Text(said)).Append("</p>\n");
        }
    }
}

/// <summary>Every figure as inline SVG with its caption.</summary>
public sealed class FiguresSection : IHtmlSection
{
    /// <inheritdoc />
    public string Id => "figures";
    /// <inheritdoc />
    public string Heading => "Figures";
    /// <inheritdoc />
    public void WriteBody(StringBuilder html, ReportContent content)
    {
        int n = 0;
        foreach (var f in content.Figures)
        {
            n++;
            var svg = FigureRenderer.RenderSvg(f);
            int start = svg.IndexOf("<svg", StringComparison.Ordinal);
            // Figures are drawn for 96 dpi; let them grow to 1.4× that at most so text stays near body size.
            var (w, _) = FigureRenderer.LogicalSize(f);
            html.Append("<figure id=\"fig-").Append(Html.Text(f.Id)).Append("\" style=\"max-width: ")
                .Append(Math.Round(w * 1.4).ToString(CultureInfo.InvariantCulture)).Append("px\">\n")
                .Append(svg, start, svg.Length - start).Append('\n')
                .Append("<figcaption><strong>Figure ").Append(n).Append(". ").Append(Html.Text(f.Title)).Append(".</strong> ")
                .Append(Html.Text(f.Caption)).Append("</figcaption>\n</figure>\n");
        }
        if (n == 0) html.Append("<p>No figure could be drawn from these results.</p>\n");
    }
}

/// <summary>Provenance: version, commit, command, seed and inputs with SHA-256; the study file as a code block.</summary>
public sealed class ManifestSection : IHtmlSection
{
    /// <inheritdoc />
    public string Id => "manifest";
    /// <inheritdoc />
    public string Heading => "Provenance";
    /// <inheritdoc />
    public void WriteBody(StringBuilder html, ReportContent content)
    {
        if (content.Data.Manifest is not { } m)
        {
            html.Append("<p>No run manifest was recorded.</p>\n");
            return;
        }
        html.Append("<div class=\"provenance\">\n");
        Html.KeyValues(html, "kv", [
            ("SizeTest", m.SizeTestVersion),
            ("commit", m.GitCommit.Length > 0 ? m.GitCommit : "unknown"),
            ("command", m.Command.Length > 0 ? m.Command : "(not recorded)"),
            ("seed", m.Seed.ToString(CultureInfo.InvariantCulture)),
            ("machine", $"{m.Machine.OperatingSystem}, {m.Machine.Architecture}, {m.Machine.ProcessorCount} processors, {m.Machine.Runtime}"),
        ]);
        html.Append("<table id=\"table-inputs\"><thead><tr><th>input</th><th>sha256</th></tr></thead><tbody>\n");
        foreach (var i in m.Inputs) html.Append("<tr><td>").Append(Html.Text(i.Path)).Append("</td><td class=\"hash\">").Append(Html.Text(i.Sha256)).Append("</td></tr>\n");
        html.Append("</tbody></table>\n<p>The full manifest, with timings, is <code>manifest.json</code> beside this report.</p>\n</div>\n");
        if (m.StudyFileText.Length > 0)
        {
            html.Append("<h3>Study file").Append(m.StudyFilePath.Length > 0 ? " (" + Html.Text(m.StudyFilePath) + ")" : "").Append("</h3>\n<pre class=\"study\"><code>")
                .Append(Html.Text(m.StudyFileText.ReplaceLineEndings("\n").TrimEnd())).Append("</code></pre>\n");
        }
    }
}

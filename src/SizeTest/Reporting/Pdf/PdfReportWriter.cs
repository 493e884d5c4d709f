using System.Globalization;
using SkiaSharp;

namespace SizeTest.Reporting.Pdf;

/// <summary>
/// Writes the PDF report with SkiaSharp's PDF backend: a title page, the summary (data,
/// conclusions beside their assumptions, the caution), every figure as vector graphics with
/// its caption, the tables, and the run manifest. Text is real text in the embedded DejaVu Sans
/// (extractable and searchable).
/// </summary>
public sealed class PdfReportWriter
{
    /// <summary>Creates a writer for the given paper (default A4).</summary>
    public PdfReportWriter(PaperSize? paper = null) => Paper = paper ?? PaperSize.A4;

    /// <summary>Page size.</summary>
    public PaperSize Paper { get; }

    /// <summary>Renders the report; returns the PDF bytes and the heading of each page.</summary>
    public PdfReport Render(ReportContent content)
    {
        ArgumentNullException.ThrowIfNull(content);
        var data = content.Data;
        var job = data.Job;
        using var ms = new MemoryStream();
        var meta = new SKDocumentPdfMetadata
        {
            Title = job.Title, Subject = "SizeTest report", Creator = "SizeTest " + job.SizeTestVersion,
            Producer = "SizeTest (SkiaSharp PDF)", Creation = null, Modified = null,
        };
        List<string> headings;
        List<float> tableSizes;
        int pages;
        using (var doc = SKDocument.CreatePdf(ms, meta))
        using (var flow = new PdfPageFlow(doc, Paper, $"SizeTest report: {job.Title}"))
        {
            // Page 1: title, the verdict table and the handful of sentences under it.
            flow.NewPage("title");
            flow.Paragraph(job.Title, 18f, bold: true);
            flow.Paragraph("SizeTest report — angular size and surface brightness versus redshift", 11f, isMuted: true);
            if (job.Synthetic) flow.Paragraph("Synthetic data: this report was made from a synthetic (demo or mock) catalogue.", 10f, bold: true);
            flow.Heading("Verdict");
            flow.Table(content.Table("summary"));
            foreach (var c in content.Conclusions) flow.Paragraph(c, 10f, indent: 12f, bullet: "•");

            // What was run, the data, the evolution tests and the assumptions.
            flow.Heading("Job and data");
            var d = data.Data;
            flow.KeyValues([
                ("study file", job.StudyFile.Length > 0 ? job.StudyFile : "(none)"),
                ("catalogue", job.Catalogue),
                ("models", string.Join(", ", data.Models.Select(m => m.Label))),
                ("method", job.Method.Length > 0 ? job.Method : "(not stated)"),
                ("rows read", d.RowsRead.ToString(CultureInfo.InvariantCulture)),
                ("accepted", d.Accepted.ToString(CultureInfo.InvariantCulture)),
                ("rejected", d.Rejected.ToString(CultureInfo.InvariantCulture)),
                ("size definition", d.SizeDefinition.Length > 0 ? d.SizeDefinition : "(not stated)"),
                ("band", d.Band.Length > 0 ? d.Band : "(not stated)"),
            ]);
            flow.Table(content.Table("rejects"));
            flow.Heading("Evolution tests");
            flow.Table(content.Table("evolution-tests"));
            foreach (var c in ReportConclusions.Statements(data)) flow.Paragraph(c, 9.5f, indent: 12f, bullet: "•");
            if (data.ExtraConclusions.Count > 0)
            {
                flow.SubHeading("Notes");
                foreach (var c in data.ExtraConclusions) flow.Paragraph(c, 9.5f, indent: 12f, bullet: "•");
            }
            flow.SubHeading("Assumptions these conclusions rest on");
            foreach (var a in data.Assumptions) flow.Paragraph($"{a.Topic}: {a.Statement}", 9.5f, indent: 12f, bullet: "•");
            if (data.Power is { Statement.Length: > 0 } power)
            {
                flow.SubHeading(Html.ConclusionsSection.PowerHeading);
                flow.Paragraph(power.Statement, 9.5f);
                if (power.Assumptions.Count > 0) flow.Paragraph("It assumes:", 9.5f);
                foreach (var a in power.Assumptions) flow.Paragraph(a, 9.5f, indent: 12f, bullet: "•");
            }
            flow.Paragraph("Caution. " + ReportConclusions.Caution, 9.5f, isMuted: true);

            // Figures.
            flow.Heading("Figures", keepWithNext: content.Figures.Count > 0 ? flow.FigureHeight(content.Figures[0]) : 80f);
            int n = 0;
            foreach (var f in content.Figures) flow.Figure(f, ++n);
            if (n == 0) flow.Paragraph("No figure could be drawn from these results.", 10f);

            // Tables (the summary, evolution-test and reject tables are shown above).
            flow.Heading("Parameters and model comparison");
            foreach (var t in content.Tables.Where(t => t.Id is "parameters" or "comparison" or Tables.ResamplingTables.BootstrapId or Tables.ResamplingTables.CrossValidationId))
            {
                flow.Table(t);
                if (Tables.ResamplingTables.Sentence(data, t.Id) is { } said) flow.Paragraph(said, 9.5f);
            }

            // Provenance.
            flow.Heading("Provenance");
            if (data.Manifest is { } m)
            {
                var rows = new List<(string, string)>
                {
                    ("SizeTest", m.SizeTestVersion),
                    ("commit", m.GitCommit.Length > 0 ? m.GitCommit : "unknown"),
                    ("command", m.Command.Length > 0 ? m.Command : "(not recorded)"),
                    ("seed", m.Seed.ToString(CultureInfo.InvariantCulture)),
                };
                rows.AddRange(m.Inputs.Select(i => ("input", $"{i.Path} (sha256 {i.Sha256})")));
                flow.Box(rows);
                flow.Paragraph("The full manifest, with machine and timings, is manifest.json beside this report.", 9f, isMuted: true);
                if (m.StudyFileText.Length > 0)
                {
                    flow.SubHeading("Study file" + (m.StudyFilePath.Length > 0 ? $" ({m.StudyFilePath})" : ""));
                    flow.Code(m.StudyFileText);
                }
            }
            else flow.Paragraph("No run manifest was recorded.", 10f);

            flow.EndPage();
            headings = flow.PageHeadings;
            tableSizes = flow.TableSizes;
            pages = flow.Pages;
            doc.Close();
        }
        return new PdfReport(ms.ToArray(), pages, headings) { TableFontSizes = tableSizes };
    }

    /// <summary>Renders and writes the PDF atomically to <paramref name="path"/>.</summary>
    public PdfReport Write(ReportContent content, string path)
    {
        var r = Render(content);
        SizeTest.Foundation.Files.AtomicFile.WriteAllBytes(path, r.Bytes);
        return r;
    }
}

/// <summary>A rendered PDF report.</summary>
/// <param name="Bytes">PDF file bytes.</param>
/// <param name="Pages">Number of pages.</param>
/// <param name="PageHeadings">What starts each page ("title", "Summary", "Figures", "continued", "Figure 3", …).</param>
public sealed record PdfReport(byte[] Bytes, int Pages, IReadOnlyList<string> PageHeadings)
{
    /// <summary>The font size (pt) each table was set in, in report order.</summary>
    public IReadOnlyList<float> TableFontSizes { get; init; } = [];
}

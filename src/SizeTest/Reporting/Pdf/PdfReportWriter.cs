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
        int pages;
        using (var doc = SKDocument.CreatePdf(ms, meta))
        using (var flow = new PdfPageFlow(doc, Paper, $"SizeTest report: {job.Title}"))
        {
            // Title page.
            flow.NewPage("title");
            flow.Space(120f);
            flow.Paragraph(job.Title, 24f, bold: true);
            flow.Paragraph("SizeTest report — angular size and surface brightness versus redshift", 12f, isMuted: true);
            if (job.Synthetic) flow.Paragraph("Synthetic data: this report was made from a synthetic (demo or mock) catalogue.", 11f, bold: true);
            flow.Space(30f);
            flow.KeyValues([
                ("study file", job.StudyFile.Length > 0 ? job.StudyFile : "(none)"),
                ("catalogue", job.Catalogue),
                ("models", string.Join(", ", data.Models.Select(m => m.Label))),
                ("method", job.Method.Length > 0 ? job.Method : "(not stated)"),
                ("SizeTest", job.SizeTestVersion + (job.GitCommit.Length > 0 ? $" (commit {job.GitCommit})" : "")),
                ("seed", job.Seed.ToString(CultureInfo.InvariantCulture)),
            ]);

            // Summary.
            flow.NewPage("Summary");
            flow.Heading("Summary");
            var d = data.Data;
            flow.Paragraph("Data", 11f, bold: true);
            flow.KeyValues([
                ("rows read", d.RowsRead.ToString(CultureInfo.InvariantCulture)),
                ("accepted", d.Accepted.ToString(CultureInfo.InvariantCulture)),
                ("rejected", d.Rejected.ToString(CultureInfo.InvariantCulture)),
                ("size definition", d.SizeDefinition.Length > 0 ? d.SizeDefinition : "(not stated)"),
                ("band", d.Band.Length > 0 ? d.Band : "(not stated)"),
            ]);
            flow.Paragraph("Conclusions", 11f, bold: true);
            foreach (var c in content.Conclusions) flow.Paragraph(c, 10f, indent: 12f, bullet: "•");
            flow.Paragraph("Assumptions these conclusions rest on", 11f, bold: true);
            foreach (var a in data.Assumptions) flow.Paragraph($"{a.Topic}: {a.Statement}", 10f, indent: 12f, bullet: "•");
            flow.Paragraph("Caution. " + ReportConclusions.Caution, 9.5f, isMuted: true);

            // Figures.
            flow.NewPage("Figures");
            flow.Heading("Figures");
            int n = 0;
            foreach (var f in content.Figures) flow.Figure(f, ++n);

            // Tables.
            flow.NewPage("Tables");
            flow.Heading("Tables");
            foreach (var t in content.Tables) flow.Table(t);

            // Manifest.
            flow.NewPage("Run manifest");
            flow.Heading("Run manifest");
            if (data.Manifest is { } m)
            {
                flow.Paragraph("Inputs and their SHA-256 checksums:", 10f);
                foreach (var i in m.Inputs) flow.Paragraph($"{i.Path}  {i.Sha256}", 8.5f, indent: 12f, bullet: "•");
                flow.Paragraph("manifest.json (timestamps and timings are in its \"volatile\" field):", 10f);
                foreach (var line in m.ToJson().Split('\n')) flow.Paragraph(line.Length == 0 ? " " : line, 7.5f, indent: 8f);
            }
            else flow.Paragraph("No run manifest was recorded.", 10f);

            flow.EndPage();
            headings = flow.PageHeadings;
            pages = flow.Pages;
            doc.Close();
        }
        return new PdfReport(ms.ToArray(), pages, headings);
    }

    /// <summary>Renders and writes the PDF atomically to <paramref name="path"/>.</summary>
    public PdfReport Write(ReportContent content, string path)
    {
        var r = Render(content);
        Common.AtomicFile.WriteAllBytes(path, r.Bytes);
        return r;
    }
}

/// <summary>A rendered PDF report.</summary>
/// <param name="Bytes">PDF file bytes.</param>
/// <param name="Pages">Number of pages.</param>
/// <param name="PageHeadings">What starts each page ("title", "Summary", "Figures", "continued", "Figure 3", …).</param>
public sealed record PdfReport(byte[] Bytes, int Pages, IReadOnlyList<string> PageHeadings);

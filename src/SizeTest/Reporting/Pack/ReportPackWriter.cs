using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Files;
using SizeTest.Reporting.Html;
using SizeTest.Reporting.Pdf;
using SizeTest.Reporting.Rendering;
using SizeTest.Reporting.Tables;

namespace SizeTest.Reporting.Pack;

/// <summary>
/// Writes a report folder: <c>report.html</c>, <c>report.pdf</c>, <c>figures/</c> (every figure
/// as 300-dpi PNG, SVG and PDF), <c>tables/</c> (CSV and LaTeX tabular of each table),
/// <c>figures.zip</c> (the figures and tables, ready to upload to a journal), <c>manifest.json</c> and <c>report-data.json</c> (what everything is drawn from, so
/// <see cref="ReportRedraw"/> can redraw the folder later). <see cref="Write"/> builds the folder in a staging copy and swaps it in
/// only when complete, so a failure leaves the previous report untouched.
/// </summary>
public sealed class ReportPackWriter
{
    /// <summary>Creates a writer.</summary>
    public ReportPackWriter(ReportPackOptions? options = null) => Options = options ?? new ReportPackOptions();

    /// <summary>Options.</summary>
    public ReportPackOptions Options { get; }

    /// <summary>
    /// Writes the whole report into <paramref name="targetDir"/>: refuses an existing non-empty
    /// folder unless <paramref name="force"/> (an <see cref="InputException"/>), writes into a
    /// staging folder, lets <paramref name="writeExtra"/> add files (e.g. <c>results.json</c>)
    /// through <see cref="OutputFolder.PathOf"/>, and commits. On any exception the staging
    /// folder is discarded and the target is left as it was.
    /// </summary>
    public IReadOnlyList<string> Write(string targetDir, bool force, ReportContent content, Action<OutputFolder>? writeExtra = null)
    {
        var folder = OutputFolder.Begin(targetDir, force);
        try
        {
            var files = WriteInto(folder.Staging, content);
            writeExtra?.Invoke(folder);
            folder.Commit();
            return files;
        }
        catch
        {
            folder.Abandon();
            throw;
        }
    }

    /// <summary>Writes every report file into an existing folder; returns the relative paths written, sorted.</summary>
    public IReadOnlyList<string> WriteInto(string folder, ReportContent content)
    {
        ArgumentNullException.ThrowIfNull(content);
        var written = new List<string>();
        void Text(string rel, string text) { AtomicFile.WriteAllText(Path.Combine(folder, rel), text); written.Add(rel); }
        void Bytes(string rel, byte[] bytes) { AtomicFile.WriteAllBytes(Path.Combine(folder, rel), bytes); written.Add(rel); }

        foreach (var figure in content.Figures)
        {
            var f = Options.FigureWidth is { } width ? figure.AtWidth(width) : figure;
            if (Options.Png) Bytes($"figures/{f.Id}.png", FigureRenderer.RenderPng(f, Options.PngDpi).Bytes);
            if (Options.Svg) Text($"figures/{f.Id}.svg", FigureRenderer.RenderSvg(f));
            if (Options.Pdf) Bytes($"figures/{f.Id}.pdf", FigureRenderer.RenderPdf(f));
        }
        foreach (var t in content.Tables)
        {
            Text($"tables/{t.Id}.csv", TableFormats.ToCsv(t));
            Text($"tables/{t.Id}.tex", TableFormats.ToLatex(t));
        }
        // The figure pack (figures.zip) only when a figure format was asked: a study that asks for html alone gets no pack.
        if (Options.Png || Options.Svg || Options.Pdf)
        {
            var packed = written.Where(r => r.StartsWith("figures/", StringComparison.Ordinal) || r.StartsWith("tables/", StringComparison.Ordinal)).Order(StringComparer.Ordinal).ToList();
            Bytes(FigurePackZip.FileName, FigurePackZip.Build(folder, packed));
        }
        if (content.Data.Manifest is { } m) Text("manifest.json", m.ToJson());
        Text(Data.ReportDataJson.FileName, Data.ReportDataJson.ToJson(content.Data));
        if (Options.Html) Text("report.html", new HtmlReportWriter().Render(content));
        if (Options.PdfReport) Bytes("report.pdf", new PdfReportWriter(Options.Paper).Render(content).Bytes);
        written.Sort(StringComparer.Ordinal);
        return written;
    }
}

/// <summary>What a report folder contains.</summary>
public sealed record ReportPackOptions
{
    /// <summary>Write figures as PNG.</summary>
    public bool Png { get; init; } = true;
    /// <summary>PNG resolution (dots per inch).</summary>
    public double PngDpi { get; init; } = FigureRenderer.DefaultPngDpi;
    /// <summary>Write figures as SVG.</summary>
    public bool Svg { get; init; } = true;
    /// <summary>Write figures as one-page vector PDFs.</summary>
    public bool Pdf { get; init; } = true;
    /// <summary>Write <c>report.html</c>.</summary>
    public bool Html { get; init; } = true;
    /// <summary>Write <c>report.pdf</c>.</summary>
    public bool PdfReport { get; init; } = true;
    /// <summary>Paper size of <c>report.pdf</c>.</summary>
    public PaperSize Paper { get; init; } = PaperSize.A4;
    /// <summary>Printed width of the files in <c>figures/</c> and <c>figures.zip</c> (null: each figure's own size).</summary>
    public Figures.FigureWidth? FigureWidth { get; init; }
}

using System.Text;
using SizeTest.Reporting.Rendering;

namespace SizeTest.Reporting.Html;

/// <summary>
/// Writes the HTML report: one self-contained file (inline SVG figures, inline CSS, the
/// DejaVu Sans font embedded as a data URL; no scripts, no network) that opens in any browser.
/// The page is the <see cref="Sections"/> in order, each with an anchor, after a title block
/// and a table of contents.
/// </summary>
public sealed class HtmlReportWriter
{
    /// <summary>The standard sections in order: verdict, job summary, data, evolution tests with assumptions, tables, figures, provenance.</summary>
    public static IReadOnlyList<IHtmlSection> DefaultSections { get; } =
    [
        new VerdictSection(), new JobSummarySection(), new DataSummarySection(), new ConclusionsSection(),
        new TablesSection(), new FiguresSection(), new ManifestSection(),
    ];

    /// <summary>Creates a writer with the given sections (default <see cref="DefaultSections"/>).</summary>
    public HtmlReportWriter(IReadOnlyList<IHtmlSection>? sections = null, bool embedFont = true)
    {
        Sections = sections ?? DefaultSections;
        EmbedFont = embedFont;
    }

    /// <summary>The sections, in page order.</summary>
    public IReadOnlyList<IHtmlSection> Sections { get; }

    /// <summary>Whether the DejaVu Sans font file is embedded (so the page looks the same where it is not installed).</summary>
    public bool EmbedFont { get; }

    /// <summary>The whole page as a string.</summary>
    public string Render(ReportContent content)
    {
        ArgumentNullException.ThrowIfNull(content);
        var job = content.Data.Job;
        var sb = new StringBuilder();
        sb.Append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n")
          .Append("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n")
          .Append("<meta name=\"generator\" content=\"SizeTest ").Append(Html.Text(job.SizeTestVersion)).Append("\">\n")
          .Append("<title>").Append(Html.Text(job.Title)).Append(" — SizeTest report</title>\n<style>\n");
        if (EmbedFont)
            sb.Append("@font-face { font-family: 'DejaVu Sans'; font-weight: normal; src: url(data:font/ttf;base64,")
              .Append(Convert.ToBase64String(FontRegistry.RegularFontFile.Span)).Append(") format('truetype'); }\n");
        sb.Append(Css).Append("</style>\n</head>\n<body>\n<header>\n<h1>").Append(Html.Text(job.Title)).Append("</h1>\n")
          .Append("<p class=\"sub\">SizeTest report — angular size and surface brightness versus redshift</p>\n");
        if (job.Synthetic)
            sb.Append("<p class=\"synthetic\">Synthetic data: this report was made from a synthetic (demo or mock) catalogue.</p>\n");
        sb.Append("<nav><ol>\n");
        foreach (var s in Sections) sb.Append("<li><a href=\"#").Append(s.Id).Append("\">").Append(Html.Text(s.Heading)).Append("</a></li>\n");
        sb.Append("</ol></nav>\n</header>\n<main>\n");
        foreach (var s in Sections)
        {
            sb.Append("<section id=\"").Append(s.Id).Append("\" data-section=\"").Append(s.Id).Append("\">\n<h2>").Append(Html.Text(s.Heading)).Append("</h2>\n");
            s.WriteBody(sb, content);
            sb.Append("</section>\n");
        }
        sb.Append("</main>\n<footer><p>Made by SizeTest ").Append(Html.Text(job.SizeTestVersion))
          .Append(". Figures use the colour-blind-safe palette of Okabe &amp; Ito (2008). Font: DejaVu Sans (Bitstream Vera licence).</p></footer>\n</body>\n</html>\n");
        return sb.ToString();
    }

    /// <summary>Renders and writes the page atomically to <paramref name="path"/>.</summary>
    public void Write(ReportContent content, string path) => SizeTest.Foundation.Files.AtomicFile.WriteAllText(path, Render(content));

    private const string Css = """
        :root { --ink: #1a1a1a; --muted: #555; --rule: #d0d0d0; --accent: #0072B2; --warn: #D55E00; }
        * { box-sizing: border-box; }
        body { font-family: 'DejaVu Sans', Verdana, sans-serif; color: var(--ink); margin: 0 auto; max-width: 1000px; padding: 1.5rem 2rem 3rem; line-height: 1.45; font-size: 15px; background: #fff; }
        h1 { font-size: 1.7rem; margin: 0 0 .2rem; }
        h2 { font-size: 1.25rem; border-bottom: 2px solid var(--accent); padding-bottom: .2rem; margin-top: 2.2rem; }
        h3 { font-size: 1.05rem; margin: .2rem 0 .5rem; }
        .sub { color: var(--muted); margin: 0 0 1rem; }
        .synthetic { border: 2px solid var(--warn); color: var(--warn); padding: .4rem .7rem; font-weight: bold; display: inline-block; }
        nav ol { columns: 2; padding-left: 1.4rem; margin: .5rem 0; }
        nav a { color: var(--accent); text-decoration: none; }
        table { border-collapse: collapse; margin: .8rem 0 1.4rem; font-size: 13px; width: 100%; }
        caption { caption-side: top; text-align: left; padding-bottom: .35rem; color: var(--muted); font-size: 13px; }
        caption strong { color: var(--ink); }
        th, td { border-bottom: 1px solid var(--rule); padding: .25rem .5rem; text-align: left; vertical-align: top; }
        thead th { border-bottom: 2px solid var(--ink); }
        td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; }
        table.kv { width: auto; }
        table.kv th { font-weight: normal; color: var(--muted); padding-right: 1.5rem; }
        td.hash { font-family: 'DejaVu Sans Mono', monospace; font-size: 12px; word-break: break-all; }
        .pair { display: grid; grid-template-columns: 1.2fr 1fr; gap: 1.5rem; }
        .assumptions { background: #f4f7fa; border-left: 4px solid var(--accent); padding: .6rem 1rem; }
        .assumptions dt { font-weight: bold; margin-top: .4rem; }
        .assumptions dd { margin: 0 0 .3rem; }
        .conclusions ul { padding-left: 1.2rem; margin: 0; }
        .conclusions li { margin-bottom: .35rem; }
        .caution { border-left: 4px solid var(--warn); padding: .5rem 1rem; background: #fdf3ec; }
        figure { margin: 1.2rem 0 2rem; break-inside: avoid; }
        figure svg { width: 100%; height: auto; display: block; }
        figcaption { font-size: 13px; color: var(--muted); margin-top: .4rem; }
        figcaption strong { color: var(--ink); }
        pre.study { background: #f6f6f6; border: 1px solid var(--rule); padding: .8rem; font-family: 'DejaVu Sans Mono', monospace; font-size: 12px; overflow-x: auto; white-space: pre; }
        .provenance { border: 1px solid var(--rule); border-left: 4px solid var(--accent); padding: .4rem 1rem; background: #f8fafc; }
        th { white-space: nowrap; }
        td.num { white-space: nowrap; }
        ul.verdict { font-size: 1.02rem; }
        ul.verdict li { margin-bottom: .3rem; }
        #table-summary td:first-child { font-weight: bold; }
        footer { margin-top: 3rem; color: var(--muted); font-size: 12px; border-top: 1px solid var(--rule); }
        @media (max-width: 760px) { .pair { grid-template-columns: 1fr; } nav ol { columns: 1; } }
        @media print { body { max-width: none; } nav { display: none; } }

        """;
}

using SkiaSharp;

namespace SizeTest.Reporting.Pdf;

/// <summary>
/// A minimal top-to-bottom page flow on an SKDocument: wrapped paragraphs, headings, key/value
/// lists, tables and vector figures, breaking to a new page when the next block does not fit.
/// Units are points.
/// </summary>
internal sealed class PdfPageFlow : IDisposable
{
    private readonly SKDocument doc;
    private readonly PaperSize paper;
    private readonly string footer;
    private SKCanvas? canvas;
    private readonly SKPaint ink = new() { Color = new SKColor(0x1a, 0x1a, 0x1a), IsAntialias = true };
    private readonly SKPaint muted = new() { Color = new SKColor(0x55, 0x55, 0x55), IsAntialias = true };
    private readonly SKPaint accent = new() { Color = new SKColor(0x00, 0x72, 0xB2), IsAntialias = true, StrokeWidth = 1.2f };
    private readonly SKPaint rule = new() { Color = new SKColor(0xC8, 0xC8, 0xC8), IsAntialias = true, StrokeWidth = 0.5f };

    public PdfPageFlow(SKDocument doc, PaperSize paper, string footer)
    {
        this.doc = doc;
        this.paper = paper;
        this.footer = footer;
    }

    public const float MarginPt = 56f;
    public float Left => MarginPt;
    public float Width => paper.WidthPt - 2 * MarginPt;
    public float Bottom => paper.HeightPt - MarginPt;
    public float Y { get; private set; }
    public int Pages { get; private set; }
    public List<string> PageHeadings { get; } = [];

    public SKCanvas Canvas => canvas ?? throw new InvalidOperationException("no page");

    public void NewPage(string heading)
    {
        EndPage();
        canvas = doc.BeginPage(paper.WidthPt, paper.HeightPt);
        Pages++;
        PageHeadings.Add(heading);
        Y = MarginPt;
        using var f = Font(false, 8f);
        canvas.DrawText($"{footer} — page {Pages}", Left, paper.HeightPt - MarginPt / 2, SKTextAlign.Left, f, muted);
    }

    public void EndPage()
    {
        if (canvas is null) return;
        doc.EndPage();
        canvas = null;
    }

    public void Ensure(float height, string headingIfNew)
    {
        if (canvas is null || Y + height > Bottom) NewPage(headingIfNew);
    }

    public static SKFont Font(bool bold, float size) =>
        new(bold ? Rendering.FontRegistry.Bold : Rendering.FontRegistry.Regular, size) { Subpixel = true };

    /// <summary>
    /// A section heading, kept on one page with at least a few lines of what follows (no orphaned heading), or with
    /// the first <paramref name="keepWithNext"/> points of it (a figure: the heading moves to the figure's page).
    /// </summary>
    public void Heading(string text, float size = 15f, float keepWithNext = 80f)
    {
        Ensure(size * 2.6f + Math.Min(keepWithNext, Bottom - MarginPt - size * 2.6f), text);
        Y += size * 0.9f;
        using var f = Font(true, size);
        Canvas.DrawText(text, Left, Y + size * 0.8f, SKTextAlign.Left, f, ink);
        Y += size * 1.2f;
        Canvas.DrawLine(Left, Y, Left + Width, Y, accent);
        Y += size * 0.6f;
    }

    public void Paragraph(string text, float size = 10f, bool bold = false, bool isMuted = false, float indent = 0f, string bullet = "")
    {
        using var f = Font(bold, size);
        var lines = Wrap(Foundation.Text.ProseText.Collapse(text), f, Width - indent);
        float lh = size * 1.35f;
        for (int i = 0; i < lines.Count; i++)
        {
            Ensure(lh, "continued");
            if (i == 0 && bullet.Length > 0) Canvas.DrawText(bullet, Left + indent - size * 0.9f, Y + size, SKTextAlign.Left, f, ink);
            Canvas.DrawText(lines[i], Left + indent, Y + size, SKTextAlign.Left, f, isMuted ? muted : ink);
            Y += lh;
        }
        Y += size * 0.45f;
    }

    /// <summary>A bold run-in heading kept on one page with the first three lines of what follows.</summary>
    public void SubHeading(string text, float size = 11f)
    {
        Ensure(size * 1.35f + 3 * 9.5f * 1.35f, "continued");
        Paragraph(text, size, bold: true);
    }

    public void Space(float pt) => Y += pt;

    public void KeyValues(IEnumerable<(string Key, string Value)> rows, float size = 10f)
    {
        using var fk = Font(false, size);
        float keyW = 120f;
        foreach (var (k, v) in rows)
        {
            var lines = Wrap(v, fk, Width - keyW);
            float lh = size * 1.35f;
            Ensure(lh * lines.Count, "continued");
            Canvas.DrawText(k, Left, Y + size, SKTextAlign.Left, fk, muted);
            foreach (var l in lines)
            {
                Canvas.DrawText(l, Left + keyW, Y + size, SKTextAlign.Left, fk, ink);
                Y += lh;
            }
        }
        Y += size * 0.6f;
    }

    /// <summary>Smallest font a table is set in (pt); below it columns wrap instead of the type shrinking further.</summary>
    public const float MinTableFontPt = 7.5f;

    /// <summary>
    /// A table with a caption. Column headings wrap between words inside their columns; the font shrinks (down to
    /// <see cref="MinTableFontPt"/>) until the columns fit the width, and when they still do not, text cells wrap
    /// between words inside their column (numbers never wrap); numeric columns are right-aligned.
    /// </summary>
    public void Table(Tables.ReportTable t)
    {
        if (t.Rows.Count == 0)
        {
            Paragraph(t.Title + ". " + (t.EmptyText.Length > 0 ? t.EmptyText : "The table has no rows."), 10f);
            return;
        }
        // Keep the caption with the header and first rows (no orphaned caption at a page foot).
        using (var cf = Font(false, 9f)) Ensure(Wrap(t.Title + ". " + t.Caption, cf, Width).Count * 9f * 1.35f + 9f * 1.5f * 5, "continued");
        Paragraph(t.Title + ". " + t.Caption, 9f, isMuted: true);
        // Headings break only between words, never inside one.
        var heads = t.Columns.Select(c => c.Split(' ', StringSplitOptions.RemoveEmptyEntries)).ToArray();
        var numeric = t.Columns.Select((_, j) => t.Rows.Count > 0 && t.Rows.All(r => r[j].Length == 0 || IsNumber(r[j]))).ToArray();
        var (size, widths) = TableLayout(t, heads, numeric, Width);
        TableSizes.Add(size);
        float lh = size * 1.5f;
        using (var fb = Font(true, size))
        {
            // Each heading wrapped between words into its column (a column is at least as wide as its longest heading word).
            var headCells = t.Columns.Select((c, j) => Wrap(string.Join(' ', heads[j]), fb, widths[j] - 0.6f * size)).ToArray();
            int headLines = headCells.Max(h => h.Count);
            Ensure(lh * (headLines + 1), "continued");
            for (int line = 0; line < headLines; line++)
                DrawRow(headCells.Select(h => line < h.Count ? h[line] : "").ToArray(), widths, numeric, fb, size);
            Canvas.DrawLine(Left, Y, Left + widths.Sum(), Y, ink);
        }
        using var fr = Font(false, size);
        foreach (var r in t.Rows)
        {
            // Each text cell wrapped into its column; the row is as tall as its tallest cell.
            var cells = r.Select((c, j) => numeric[j] ? new List<string> { c } : Wrap(c, fr, widths[j] - 0.6f * size)).ToArray();
            int lines = cells.Max(c => c.Count);
            Ensure(lh * lines, "continued");
            for (int line = 0; line < lines; line++)
                DrawRow(cells.Select(c => line < c.Count ? c[line] : "").ToArray(), widths, numeric, fr, size);
            Canvas.DrawLine(Left, Y, Left + widths.Sum(), Y, rule);
        }
        Y += 10f;
    }

    /// <summary>The font size of each table drawn, in order (for tests: no table is set below <see cref="MinTableFontPt"/>).</summary>
    public List<float> TableSizes { get; } = [];

    /// <summary>
    /// Font size and column widths: the largest size from 9 pt down to <see cref="MinTableFontPt"/> at which every
    /// column fits unwrapped; otherwise the minimum size, each column at least its widest word (a number: its whole
    /// cell) and the room left shared in proportion to what each column would need unwrapped.
    /// </summary>
    private static (float Size, float[] Widths) TableLayout(Tables.ReportTable t, string[][] heads, bool[] numeric, float width)
    {
        float[] Natural(SKFont f, SKFont fb, float size) => t.Columns.Select((c, j) => Math.Max(heads[j].Select(w => fb.MeasureText(w)).DefaultIfEmpty(0).Max(),
            t.Rows.Select(r => f.MeasureText(r[j])).DefaultIfEmpty(0).Max()) + 1.2f * size).ToArray();
        for (float size = 9f; size > MinTableFontPt; size -= 0.5f)
        {
            using var f = Font(false, size);
            using var fb = Font(true, size);
            var w = Natural(f, fb, size);
            if (w.Sum() <= width) return (size, w);
        }
        float s = MinTableFontPt;
        using var fr = Font(false, s);
        using var fh = Font(true, s);
        var natural = Natural(fr, fh, s);
        var least = t.Columns.Select((c, j) => Math.Max(heads[j].Select(w => fh.MeasureText(w)).DefaultIfEmpty(0).Max(),
            t.Rows.Select(r => numeric[j] ? fr.MeasureText(r[j]) : r[j].Split(' ').Select(w => fr.MeasureText(w)).DefaultIfEmpty(0).Max()).DefaultIfEmpty(0).Max()) + 1.2f * s).ToArray();
        float spare = width - least.Sum(), want = natural.Zip(least, (n, l) => n - l).Sum();
        if (spare <= 0 || want <= 0)
        {
            // Not even one word per column fits: scale the widths (text may then overlap; no report table is this wide).
            float scale = width / least.Sum();
            return (s, least.Select(l => l * Math.Min(1f, scale)).ToArray());
        }
        return (s, least.Select((l, j) => l + spare * (natural[j] - l) / want).ToArray());
    }

    private static bool IsNumber(string s) => Html.Html.IsNumeric(s);

    /// <summary>A code block in DejaVu Sans Mono on a light box, lines kept as they are (long lines wrap by characters).</summary>
    public void Code(string text, float size = 8f)
    {
        using var f = new SKFont(Rendering.FontRegistry.Mono, size) { Subpixel = true };
        using var box = new SKPaint { Color = new SKColor(0xF4, 0xF4, 0xF4), Style = SKPaintStyle.Fill };
        float lh = size * 1.3f;
        foreach (var raw in text.ReplaceLineEndings("\n").TrimEnd().Split('\n'))
            foreach (var line in Wrap(raw.Length == 0 ? " " : raw.Replace("\t", "    "), f, Width - 12f))
            {
                Ensure(lh, "continued");
                Canvas.DrawRect(Left, Y, Width, lh, box);
                Canvas.DrawText(line, Left + 6f, Y + size, SKTextAlign.Left, f, ink);
                Y += lh;
            }
        Y += size;
    }

    /// <summary>A bordered box of key/value lines (the provenance box).</summary>
    public void Box(IReadOnlyList<(string Key, string Value)> rows, float size = 9f)
    {
        using var fk = Font(false, size);
        float keyW = 90f, lh = size * 1.35f;
        var wrapped = rows.Select(r => (r.Key, Lines: Wrap(r.Value, fk, Width - keyW - 16f))).ToList();
        float h = wrapped.Sum(w => w.Lines.Count) * lh + 12f;
        Ensure(Math.Min(h, Bottom - MarginPt), "continued");
        float top = Y;
        Y += 6f;
        foreach (var (k, lines) in wrapped)
        {
            Ensure(lh * lines.Count, "continued");
            Canvas.DrawText(k, Left + 8f, Y + size, SKTextAlign.Left, fk, muted);
            foreach (var l in lines)
            {
                Canvas.DrawText(l, Left + 8f + keyW, Y + size, SKTextAlign.Left, fk, ink);
                Y += lh;
            }
        }
        Y += 6f;
        using var border = new SKPaint { Color = new SKColor(0x00, 0x72, 0xB2), Style = SKPaintStyle.Stroke, StrokeWidth = 0.8f, IsAntialias = true };
        if (Y > top) Canvas.DrawRect(Left, top, Width, Y - top, border);
        Y += 8f;
    }

    private void DrawRow(IReadOnlyList<string> cells, float[] widths, bool[] numeric, SKFont f, float size)
    {
        float x = Left;
        for (int j = 0; j < cells.Count; j++)
        {
            if (numeric[j]) Canvas.DrawText(cells[j], x + widths[j] - size * 0.6f, Y + size * 1.1f, SKTextAlign.Right, f, ink);
            else Canvas.DrawText(cells[j], x + size * 0.3f, Y + size * 1.1f, SKTextAlign.Left, f, ink);
            x += widths[j];
        }
        Y += size * 1.5f;
    }

    /// <summary>The scale a figure is drawn at: the text width, or less when that would be taller than 78% of the page.</summary>
    private float FigureScale(Figures.FigureSpec spec)
    {
        var (w, h) = Rendering.FigureRenderer.LogicalSize(spec);
        float scale = Width / w;
        float maxH = (Bottom - MarginPt) * 0.78f;
        return h * scale > maxH ? maxH / h : scale;
    }

    /// <summary>The height (pt) a figure and its caption take on the page.</summary>
    public float FigureHeight(Figures.FigureSpec spec)
    {
        var (_, h) = Rendering.FigureRenderer.LogicalSize(spec);
        using var cf = Font(false, 8.5f);
        return h * FigureScale(spec) + Wrap(spec.Caption, cf, Width).Count * 8.5f * 1.35f + 20f;
    }

    /// <summary>Draws a figure scaled to the text width (or to the remaining page height) as vectors.</summary>
    public void Figure(Figures.FigureSpec spec, int number)
    {
        var (w, h) = Rendering.FigureRenderer.LogicalSize(spec);
        float scale = FigureScale(spec);
        Ensure(FigureHeight(spec), $"Figure {number}");
        Canvas.Save();
        Canvas.Translate(Left + (Width - w * scale) / 2, Y);
        Canvas.Scale(scale);
        Rendering.FigureRenderer.Draw(Canvas, spec);
        Canvas.Restore();
        Y += h * scale + 6f;
        Paragraph($"Figure {number}. {spec.Title}.", 9f, bold: true);
        Y -= 4f;
        Paragraph(spec.Caption, 8.5f, isMuted: true);
        Y += 6f;
    }

    public static List<string> Wrap(string text, SKFont font, float width)
    {
        var lines = new List<string>();
        foreach (var para in text.Replace("\r", "").Split('\n'))
        {
            var line = "";
            foreach (var word in para.Split(' '))
            {
                var candidate = line.Length == 0 ? word : line + " " + word;
                if (font.MeasureText(candidate) <= width || line.Length == 0)
                {
                    line = candidate;
                    // A single word wider than the line (hashes, paths): break it by characters.
                    while (font.MeasureText(line) > width && line.Length > 1)
                    {
                        int cut = line.Length - 1;
                        while (cut > 1 && font.MeasureText(line[..cut]) > width) cut--;
                        lines.Add(line[..cut]);
                        line = line[cut..];
                    }
                }
                else
                {
                    lines.Add(line);
                    line = word;
                }
            }
            lines.Add(line);
        }
        return lines;
    }

    public void Dispose()
    {
        ink.Dispose(); muted.Dispose(); accent.Dispose(); rule.Dispose();
    }
}

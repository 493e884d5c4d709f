using SizeTest.Reporting.Data;

namespace SizeTest.Reporting.Figures;

/// <summary>Posterior corner plot: marginal histograms on the diagonal, 2-D densities below it.</summary>
public static class CornerFigure
{
    /// <summary>Figure id and file stem.</summary>
    public const string Id = "posterior-corner";

    /// <summary>Builds the figure, or null when there are no posterior samples.</summary>
    public static FigureSpec? Build(ReportData data, FigureOptions? options = null)
    {
        options ??= FigureOptions.Default;
        var post = data.Posterior;
        if (post is null || post.Samples.Count < 2 || post.Parameters.Count == 0) return null;
        int n = Math.Min(post.Parameters.Count, options.MaxCornerParameters);
        var cols = Enumerable.Range(0, n).Select(j => post.Samples.Select(r => r[j]).ToArray()).ToArray();
        AxisSpec Axis(int j) => new(post.Parameters[j], j < post.Units.Count ? post.Units[j] : AxisSpec.Dimensionless) { InnerTicks = true };
        var panels = new List<PanelSpec>();
        for (int row = 0; row < n; row++)
        for (int col = 0; col <= row; col++)
        {
            bool bottom = row == n - 1;
            if (row == col)
            {
                var h = Histogram(cols[col], 30);
                panels.Add(new PanelSpec
                {
                    X = Axis(col), Y = new AxisSpec("posterior density", "per unit of parameter") { Min = 0, InnerTicks = true },
                    Series = [h with { Color = Palette.Model(0) }],
                    Row = row, Column = col, Legend = LegendPlace.None, XAxisLabelled = bottom, YAxisLabelled = false,
                });
            }
            else
            {
                var d = FigureText.Density("", cols[col], cols[row], 30, 30, xLinear: true, yLinear: true);
                panels.Add(new PanelSpec
                {
                    X = Axis(col), Y = Axis(row), Series = [d],
                    Row = row, Column = col, Legend = LegendPlace.None, XAxisLabelled = bottom, YAxisLabelled = col == 0,
                });
            }
        }
        double size = Math.Clamp(1.6 * n, 4.0, 10.0);
        return new FigureSpec
        {
            Id = Id,
            Title = $"Posterior of {Cosmology.WorldModelDisplayNames.For(post.Model)}",
            Caption = $"Posterior samples of {Cosmology.WorldModelDisplayNames.For(post.Model)} ({post.Samples.Count} samples after burn-in): marginal histograms on the diagonal, joint densities below (darker = more samples). " +
                      (post.Parameters.Count > n ? $"Only the first {n} of {post.Parameters.Count} parameters are shown." : ""),
            Panels = panels,
            RowHeights = Enumerable.Repeat(1.0, n).ToList(),
            Columns = n,
            WidthInches = size,
            HeightInches = size,
        };
    }

    private static HistogramSeries Histogram(double[] v, int bins)
    {
        double lo = v.Min(), hi = v.Max();
        if (hi <= lo) { lo -= 0.5; hi += 0.5; }
        var edges = Enumerable.Range(0, bins + 1).Select(i => lo + (hi - lo) * i / bins).ToArray();
        var h = new double[bins];
        foreach (var x in v) h[Math.Min(bins - 1, (int)((x - lo) / (hi - lo) * bins))]++;
        double width = (hi - lo) / bins;
        return new HistogramSeries("", edges, h.Select(c => c / (v.Length * width)).ToArray());
    }
}

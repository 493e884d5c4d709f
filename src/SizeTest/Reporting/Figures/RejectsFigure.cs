using SizeTest.Reporting.Data;

namespace SizeTest.Reporting.Figures;

/// <summary>Reject-log summary: rows rejected per reason.</summary>
public static class RejectsFigure
{
    /// <summary>Figure id and file stem.</summary>
    public const string Id = "rejects";

    /// <summary>Builds the figure, or null when nothing was rejected.</summary>
    public static FigureSpec? Build(ReportData data)
    {
        var reasons = data.Data.RejectReasons.Where(r => r.Count > 0).ToList();
        if (reasons.Count == 0) return null;
        return new FigureSpec
        {
            Id = Id,
            Title = "Rejected rows by reason",
            Caption = $"Rows of the catalogue rejected before fitting, by reason ({data.Data.Rejected} of {data.Data.RowsRead} rows; " +
                      $"{data.Data.Accepted} accepted). Every rejected row is listed with its reason in the reject log.",
            Panels = [new PanelSpec
            {
                X = new AxisSpec("rejected", "rows") { Min = 0, Max = Math.Max(1, reasons.Max(r => r.Count)) * 1.05, IntegerTicks = true },
                Y = new AxisSpec("reason", AxisSpec.Dimensionless) { Categories = reasons.Select(r => r.Reason).ToList(), Inverted = true },
                Series = [new BarSeries("", reasons.Select(r => (double)r.Count).ToList()) { Horizontal = true, Color = Palette.Model(1) }],
                Legend = LegendPlace.None,
            }],
            HeightInches = Math.Max(2.2, 1.4 + 0.4 * reasons.Count),
        };
    }
}

using SizeTest.Reporting.Data;

namespace SizeTest.Reporting.Figures;

/// <summary>Power curve from mock catalogues: how often the decision rule picks the true model, against the design quantity.</summary>
public static class PowerFigure
{
    /// <summary>Figure id and file stem.</summary>
    public const string Id = "power";

    /// <summary>Builds the figure, or null when no power analysis was run.</summary>
    public static FigureSpec? Build(ReportData data)
    {
        var p = data.Power;
        if (p is null || p.Lines.Count == 0) return null;
        var series = new List<SeriesSpec>();
        for (int i = 0; i < p.Lines.Count; i++)
        {
            var l = p.Lines[i];
            series.Add(new BandSeries("", l.X, l.Lo, l.Hi) { Color = Palette.Model(i), Alpha = 0.2 });
            series.Add(new LineSeries(l.Label, l.X, l.Power) { Color = Palette.Model(i), Width = 1.6 });
            series.Add(new PointSeries("", l.X, l.Power) { Color = Palette.Model(i), MarkerSize = 4 });
        }
        if (p.Target is { } t) series.Add(new ReferenceLine($"target power {t:0.##}", t, false) { Color = Palette.Reference, Dash = DashKind.Dotted });
        return new FigureSpec
        {
            Id = Id,
            Title = "Power of the comparison",
            Caption = "Fraction of mock catalogues in which the decision rule chose the true model, with 68% binomial intervals (bands), " +
                      "against the design quantity. " +
                      (p.Target is { } tp ? $"The dotted line is the target power {tp.ToString("0.##", System.Globalization.CultureInfo.InvariantCulture)}" +
                          (p.DecisionDeltaBic is { } d ? $" for a win by ΔBIC > {d.ToString("0.##", System.Globalization.CultureInfo.InvariantCulture)}" : "") + "; below it" : "Below the target power") +
                      " the sample cannot be relied on to tell the models apart. Mock catalogues are synthetic.",
            Panels = [new PanelSpec
            {
                X = new AxisSpec(p.XLabel, p.XUnit) { Log = p.XLog },
                Y = new AxisSpec("power", AxisSpec.Dimensionless) { Min = 0, Max = 1.02 },
                Series = series, Legend = LegendPlace.Below,
            }],
        };
    }
}

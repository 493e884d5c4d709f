using SizeTest.Reporting.Data;

namespace SizeTest.Reporting.Figures;

/// <summary>How much evolution each model needs: per model and evolution term, the best value with its 68% interval, against zero (no evolution).</summary>
public static class RequiredEvolutionFigure
{
    /// <summary>Figure id and file stem.</summary>
    public const string Id = "required-evolution";

    /// <summary>Builds the figure, or null when no model reports an evolution term.</summary>
    public static FigureSpec? Build(ReportData data)
    {
        var models = data.Models.Where(m => m.RequiredEvolution.Count > 0).ToList();
        if (models.Count == 0) return null;
        var terms = models.SelectMany(m => m.RequiredEvolution).Select(e => e.Name).Distinct().OrderBy(n => n, StringComparer.Ordinal).ToList();
        var series = new List<SeriesSpec>();
        var shapes = new[] { MarkerKind.Circle, MarkerKind.Square, MarkerKind.Diamond, MarkerKind.Triangle };
        for (int t = 0; t < terms.Count; t++)
        {
            var xs = new List<double>(); var ys = new List<double>(); var lo = new List<double>(); var hi = new List<double>();
            string description = "";
            double offset = terms.Count == 1 ? 0 : -0.2 + 0.4 * t / (terms.Count - 1);
            for (int i = 0; i < models.Count; i++)
            {
                var e = models[i].RequiredEvolution.FirstOrDefault(r => r.Name == terms[t]);
                if (e is null) continue;
                description = e.Description;
                xs.Add(e.Value); ys.Add(i + offset); lo.Add(Math.Max(0, e.Value - e.Lo)); hi.Add(Math.Max(0, e.Hi - e.Value));
            }
            series.Add(new PointSeries(description.Length > 0 ? description : terms[t], xs, ys)
            {
                XErrLow = lo, XErrHigh = hi, Color = t == 0 ? Palette.Ink : Palette.Reference, Marker = shapes[t % shapes.Length], MarkerSize = 6,
            });
        }
        series.Add(new ReferenceLine("no evolution", 0, true) { Color = Palette.Ink, Dash = DashKind.Dashed });
        // Spare category rows below the last model hold the legend (about 0.45 row per entry at 48 px per row).
        const double spare = 0.0; // the legend sits under the axes
        return new FigureSpec
        {
            Id = Id,
            Title = "Evolution each model requires",
            Caption = "Best-fit evolution exponents per model with their 68% intervals (e.g. a in R ∝ (1+z)^a for size evolution). " +
                      "The dashed line is no evolution. A model that fits only with a large evolution term owes that evolution an independent justification; " +
                      "read this figure beside the information-criterion ranking.",
            Panels = [new PanelSpec
            {
                X = new AxisSpec("evolution exponent", AxisSpec.Dimensionless),
                Y = new AxisSpec("model", AxisSpec.Dimensionless) { Categories = models.Select(m => m.Label).ToList(), Inverted = true, Max = models.Count - 0.4 + spare },
                Series = series, Legend = LegendPlace.Below,
            }],
            HeightInches = (96 + 48 * (models.Count + spare)) / 96.0,
        };
    }
}

using SizeTest.Reporting.Data;

namespace SizeTest.Reporting.Figures;

/// <summary>
/// Angular size against redshift on log–log axes: the objects (with errors, or a density when
/// there are many), binned medians with bootstrap intervals, each model's best-fit θ(z) with its
/// fitted evolution (solid) and with the evolution switched off (dashed); below, residuals in
/// dex against the best-ranked model.
/// </summary>
public static class AngularSizeFigure
{
    /// <summary>Figure id and file stem.</summary>
    public const string Id = "angular-size";

    /// <summary>Builds the figure, or returns null when the sample has no angular sizes.</summary>
    public static FigureSpec? Build(ReportData data, FigureOptions? options = null)
    {
        options ??= FigureOptions.Default;
        var s = data.Objects;
        if (s.ThetaArcsec is not { } theta || s.Count == 0) return null;
        var reference = FigureText.BestByBic(data.Models, m => m.Theta is not null);

        var (zMin, zMax) = FigureText.PositiveRange(s.Z.Concat(data.ThetaBins?.SelectMany(b => new[] { b.ZLow, b.ZHigh }) ?? []));
        double lzPad = (Math.Log10(zMax) - Math.Log10(zMin)) * 0.04;
        double xMin = Math.Pow(10, Math.Log10(zMin) - lzPad), xMax = Math.Pow(10, Math.Log10(zMax) + lzPad);
        var zAxis = new AxisSpec("redshift z", AxisSpec.Dimensionless) { Log = true, Min = xMin, Max = xMax };

        var main = new List<SeriesSpec>();
        bool dense = s.Count > options.DensityThreshold;
        if (dense)
            main.Add(FigureText.Density($"objects (density, N = {s.Count})", s.Z, theta, 40, 30));
        else
            main.Add(new PointSeries($"objects (N = {s.Count})", s.Z, theta)
            {
                YErrLow = s.ThetaErrArcsec, YErrHigh = s.ThetaErrArcsec, XErrLow = s.ZErr, XErrHigh = s.ZErr,
                Color = Palette.Data, Alpha = 0.55, MarkerSize = 3,
            });
        if (data.ThetaBins is { Count: > 0 } bins)
            main.Add(new BinnedSeries("binned median, equal-count bins, at the bin's median z (bootstrap 68%)", bins.Select(b => b.ZLow).ToList(), bins.Select(b => b.ZHigh).ToList(),
                bins.Select(b => b.Value).ToList(), bins.Select(b => b.Lo).ToList(), bins.Select(b => b.Hi).ToList()) { Color = Palette.Ink, XCentre = bins.Select(b => b.ZDrawn).ToList() });
        // Curves equal to 0.2% (0.001 dex) everywhere hide each other: say so in the legend.
        var same = FigureText.CoincidesWith(data.Models.Select(m => (m.Label, m.Theta)).ToList(), 0.001, logY: true);
        for (int i = 0; i < data.Models.Count; i++)
        {
            var m = data.Models[i];
            if (m.Theta is { } c) main.Add(new LineSeries($"{m.Label}{same[i]}", c.X, c.Y) { Color = ModelStyles.Color(m.Fit.Name), Dash = ModelStyles.Dash(m.Fit.Name), Width = 1.6 });
            if (m.ThetaNoEvolution is { } c0) main.Add(new LineSeries("", c0.X, c0.Y) { Color = ModelStyles.Color(m.Fit.Name), Dash = DashKind.Dotted, Width = 1.1, Alpha = 0.8 });
        }

        if (data.Models.Any(m => m.ThetaNoEvolution is not null))
            main.Add(new LegendKey("dotted: same model, no evolution") { Color = Palette.Reference, Dash = DashKind.Dotted });

        var panels = new List<PanelSpec>
        {
            new()
            {
                X = zAxis, Y = new AxisSpec("angular size θ", "arcsec") { Log = true }, Series = main,
                Legend = LegendPlace.Below, XAxisLabelled = reference is null,
            },
        };
        if (reference?.Theta is { } refCurve)
        {
            var res = new List<SeriesSpec>();
            if (!dense)
            {
                var rx = new List<double>(); var ry = new List<double>(); var re = new List<double>();
                for (int i = 0; i < s.Count; i++)
                {
                    double mth = refCurve.At(s.Z[i], logLog: true);
                    if (!(mth > 0) || !(theta[i] > 0)) continue;
                    rx.Add(s.Z[i]); ry.Add(Math.Log10(theta[i] / mth));
                    re.Add(s.ThetaErrArcsec is { } e ? e[i] / (theta[i] * Math.Log(10)) : 0);
                }
                res.Add(new PointSeries("", rx, ry) { YErrLow = re, YErrHigh = re, Color = Palette.Data, Alpha = 0.55, MarkerSize = 3 });
            }
            if (data.ThetaBins is { Count: > 0 } b2)
            {
                var keep = b2.Where(b => refCurve.At(b.ZDrawn, true) > 0 && b.Value > 0).ToList();
                double Ref(BinnedValue b) => refCurve.At(b.ZDrawn, true);
                res.Add(new BinnedSeries("", keep.Select(b => b.ZLow).ToList(), keep.Select(b => b.ZHigh).ToList(),
                    keep.Select(b => Math.Log10(b.Value / Ref(b))).ToList(),
                    keep.Select(b => Math.Log10(Math.Max(b.Lo, 1e-300) / Ref(b))).ToList(),
                    keep.Select(b => Math.Log10(Math.Max(b.Hi, 1e-300) / Ref(b))).ToList()) { Color = Palette.Ink, XCentre = keep.Select(b => b.ZDrawn).ToList() });
            }
            for (int i = 0; i < data.Models.Count; i++)
            {
                var m = data.Models[i];
                if (m.Theta is not { } c || ReferenceEquals(m, reference)) continue;
                var xs = new List<double>(); var ys = new List<double>();
                for (int k = 0; k < c.X.Count; k++)
                {
                    double r = refCurve.At(c.X[k], true);
                    if (r > 0 && c.Y[k] > 0) { xs.Add(c.X[k]); ys.Add(Math.Log10(c.Y[k] / r)); }
                }
                res.Add(new LineSeries("", xs, ys) { Color = ModelStyles.Color(m.Fit.Name), Dash = ModelStyles.Dash(m.Fit.Name), Width = 1.4 });
            }
            res.Add(new ReferenceLine("", 0, false) { Color = ModelStyles.Color(reference.Fit.Name), Dash = ModelStyles.Dash(reference.Fit.Name) });
            panels.Add(new PanelSpec
            {
                X = zAxis, Y = new AxisSpec("Δlog₁₀θ", "dex"), Series = res, Row = 1,
                Legend = LegendPlace.None, Note = $"residuals against {reference.Label}",
            });
        }

        return new FigureSpec
        {
            Id = Id,
            Title = "Angular size versus redshift",
            Caption = "Angular size θ against redshift z, both logarithmic. " +
                      (dense ? "Objects are shown as a density (darker = more objects per cell, square-root scale). "
                             : "Grey points are the accepted objects with their 1σ errors. ") +
                      (data.ThetaBins is { Count: > 0 } ? "Black squares are medians in bins holding equal numbers of objects, drawn at each bin's median redshift, with bootstrap 68% intervals; horizontal bars span each bin. " : "") +
                      (data.Models.Any(m => m.Theta is not null)
                          ? "Each model keeps one colour and line style in every report; its line is the best fit including its fitted size evolution, and the dotted line of the same colour is that model with evolution switched off. "
                          : FitForm.WhyNoModelLine(data, "R0, a and scatter") ?? "No model line could be drawn from these fits. ") +
                      (reference is not null ? $"The lower panel shows log₁₀ residuals (dex) against the best-ranked model by BIC ({reference.Label}); coloured lines are the other models relative to it." : ""),
            Panels = panels,
            RowHeights = panels.Count == 2 ? [3.0, 1.2] : [1.0],
            HeightInches = panels.Count == 2 ? 5.6 : 4.8,
        };
    }
}

using SizeTest.Reporting.Data;

namespace SizeTest.Reporting.Figures;

/// <summary>
/// The Tolman test: surface brightness μ against 1+z (logarithmic, so pure dimming laws are
/// straight lines): the objects, binned means, the expanding-universe (1+z)^4 and static
/// (1+z)^1 bolometric dimming curves μ = μ0 + 2.5 n log10(1+z) (n = 4 and 1; Tolman 1930), and each
/// model's best fit with and without luminosity evolution.
/// </summary>
public static class SurfaceBrightnessFigure
{
    /// <summary>Figure id and file stem.</summary>
    public const string Id = "surface-brightness";

    /// <summary>Builds the figure, or null when the sample has no surface brightness.</summary>
    public static FigureSpec? Build(ReportData data, FigureOptions? options = null)
    {
        options ??= FigureOptions.Default;
        var s = data.Objects;
        if (s.Mu is not { } mu || s.Count == 0) return null;
        var onePlusZ = s.Z.Select(z => 1 + z).ToList();
        var series = new List<SeriesSpec>();
        bool dense = s.Count > options.DensityThreshold;
        if (dense)
            series.Add(FigureText.Density($"objects (density, N = {s.Count})", onePlusZ, mu, 40, 30, yLinear: true));
        else
            series.Add(new PointSeries($"objects (N = {s.Count})", onePlusZ, mu)
            {
                YErrLow = s.MuErr, YErrHigh = s.MuErr, XErrLow = s.ZErr, XErrHigh = s.ZErr,
                Color = Palette.Data, Alpha = 0.55, MarkerSize = 3,
            });
        var bins = data.MuBins;
        if (bins is { Count: > 0 })
            series.Add(new BinnedSeries("binned mean, equal-count bins, at the bin's median z (bootstrap 68%)", bins.Select(b => 1 + b.ZLow).ToList(), bins.Select(b => 1 + b.ZHigh).ToList(),
                bins.Select(b => b.Value).ToList(), bins.Select(b => b.Lo).ToList(), bins.Select(b => b.Hi).ToList()) { Color = Palette.Ink, XCentre = bins.Select(b => 1 + b.ZDrawn).ToList() });

        // Zero point of the pure dimming curves: given, or through the lowest-redshift bin.
        double? mu0 = data.SurfaceBrightnessZeroPoint;
        string anchor = "at the given zero point";
        if (mu0 is null && bins is { Count: > 0 })
        {
            var b0 = bins.OrderBy(b => b.ZLow).First();
            double zc = b0.ZDrawn;
            mu0 = b0.Value - 2.5 * 4 * Math.Log10(1 + zc);
            anchor = "through the lowest-redshift bin";
        }
        double zTop = s.Z.Where(double.IsFinite).DefaultIfEmpty(1).Max();
        var grid = Enumerable.Range(0, 61).Select(i => Math.Pow(10, Math.Log10(1 + zTop) * i / 60.0)).ToList();
        if (mu0 is { } m0)
        {
            // For n = 1 the curve is anchored at the same bin: μ0' = μ_bin − 2.5·1·log10(1+z_bin).
            double m1 = m0;
            if (data.SurfaceBrightnessZeroPoint is null && bins is { Count: > 0 })
            {
                var b0 = bins.OrderBy(b => b.ZLow).First();
                m1 = b0.Value - 2.5 * Math.Log10(1 + b0.ZDrawn);
            }
            series.Add(new LineSeries("(1+z)⁴ dimming (expanding)", grid, grid.Select(g => m0 + 10 * Math.Log10(g)).ToList()) { Color = Palette.Ink, Dash = DashKind.Dashed, Width = 1.3 });
            series.Add(new LineSeries("(1+z)¹ dimming (static)", grid, grid.Select(g => m1 + 2.5 * Math.Log10(g)).ToList()) { Color = Palette.Reference, Dash = DashKind.Dotted, Width = 1.6 });
        }
        // Each model: the expected mean of the objects passing the cuts (what the binned means estimate) in its own
        // colour and style; the untruncated relation thin and faint for reference. Identical curves are marked.
        bool selected = data.Models.Any(m => m.MuSelected is not null);
        var main = data.Models.Select(m => (m.Label, selected ? m.MuSelected : m.Mu)).ToList();
        var same = FigureText.CoincidesWith(main, 0.01, logY: false);
        for (int i = 0; i < data.Models.Count; i++)
        {
            var m = data.Models[i];
            string color = ModelStyles.Color(m.Fit.Name);
            if (main[i].Item2 is { } c)
                series.Add(new LineSeries($"{m.Label}{same[i]}", c.X.Select(z => 1 + z).ToList(), c.Y) { Color = color, Dash = ModelStyles.Dash(m.Fit.Name), Width = 1.6 });
            if (selected && m.Mu is { } u)
                series.Add(new LineSeries("", u.X.Select(z => 1 + z).ToList(), u.Y) { Color = color, Dash = DashKind.Dotted, Width = 1.0, Alpha = 0.7 });
        }
        if (selected) series.Add(new LegendKey("dotted: same model, untruncated relation") { Color = Palette.Reference, Dash = DashKind.Dotted });
        if (data.SurfaceBrightnessLimit is { } lim)
            series.Add(new ReferenceLine($"SB limit μ = {lim.ToString("0.##", System.Globalization.CultureInfo.InvariantCulture)}", lim, false) { Color = Palette.Warn, Dash = DashKind.Dashed });
        return new FigureSpec
        {
            Id = Id,
            Title = "Surface brightness versus redshift (Tolman test)",
            Caption = "Surface brightness μ against 1 + z (logarithmic axis, so pure dimming laws are straight lines). " +
                      (dense ? "Objects are shown as a density. " : "Grey points are the objects with 1σ errors. ") +
                      (bins is { Count: > 0 } ? "Black squares are binned means with bootstrap 68% intervals. " : "") +
                      (mu0 is not null ? $"The black dashed line is bolometric (1+z)⁴ dimming expected in an expanding universe and the grey dotted line (1+z)¹ dimming of a static universe, both drawn {anchor}; neither includes evolution or K-corrections beyond those applied to the data. " : "") +
                      (!data.Models.Any(m => m.Mu is not null)
                          ? !data.Models.Any(m => m.Fit.Parameters.Any(p => Inference.Comparison.EvolutionTestTable.BaseName(p.Name).StartsWith(Inference.NuisanceParameters.Names.Mu0, StringComparison.Ordinal)))
                              ? "No model line is drawn: the models were fitted to the sizes only, so none predicts μ; the points show the catalogue's surface brightness. "
                              : FitForm.WhyNoModelLine(data, "μ0, b and scatter_mag") ?? "No model line could be drawn from these fits. "
                      : selected
                          ? "Each model's line is the expected mean μ of the objects that pass the selection cuts (a Gaussian truncated at the SB limit), which is what the binned means estimate; the dotted line of the same colour is the untruncated relation μ0 + 2.5 (n − b) log10(1+z). The dashed orange line is the SB limit. "
                          : "Each model's line is its best fit with its fitted luminosity evolution. ") +
                      (data.Models.Any(m => m.Mu is not null) ? "A model listed as coinciding with another lies under it (with sb_evolution free every model fits μ equally well)." : ""),
            Panels = [new PanelSpec { X = new AxisSpec("1 + z", AxisSpec.Dimensionless) { Log = true }, Y = new AxisSpec("surface brightness μ", "mag/arcsec²"), Series = series, Legend = LegendPlace.Below }],
        };
    }
}

using SizeTest.Reporting.Data;

namespace SizeTest.Reporting.Figures;

/// <summary>All figures of a report in their fixed order, leaving out those the data cannot fill.</summary>
public static class ReportFigures
{
    /// <summary>
    /// Builds, in order: angular size, surface brightness (Tolman), required evolution, binned evolution,
    /// information criteria, posterior corner plot, power curve, reject summary.
    /// </summary>
    public static IReadOnlyList<FigureSpec> Build(ReportData data, FigureOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(data);
        var all = new[]
        {
            AngularSizeFigure.Build(data, options),
            SurfaceBrightnessFigure.Build(data, options),
            RequiredEvolutionFigure.Build(data),
            BinnedEvolutionFigure.Build(data),
            CriteriaFigure.Build(data),
            CornerFigure.Build(data, options),
            PowerFigure.Build(data),
            RejectsFigure.Build(data),
        };
        return all.Where(f => f is not null).Select(f => f!).ToList();
    }
}

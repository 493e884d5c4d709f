namespace SizeTest.Reporting.Figures;

/// <summary>
/// A 2-D histogram drawn as shaded cells (for samples too large to draw object by object).
/// Cell (i, j) spans x in [XEdges[i], XEdges[i+1]] and y in [YEdges[j], YEdges[j+1]]; on a log
/// axis give edges that are uniform in log10.
/// </summary>
/// <param name="Label">Legend text, or empty.</param>
/// <param name="XEdges">x edges, increasing, length nx+1.</param>
/// <param name="YEdges">y edges, increasing, length ny+1.</param>
/// <param name="Counts">Counts, [nx, ny].</param>
public sealed record DensitySeries(string Label, IReadOnlyList<double> XEdges, IReadOnlyList<double> YEdges, double[,] Counts) : SeriesSpec(Label)
{
    /// <inheritdoc />
    public override IEnumerable<double> XExtent() => XEdges;
    /// <inheritdoc />
    public override IEnumerable<double> YExtent() => YEdges;
}

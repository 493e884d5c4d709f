namespace SizeTest.Reporting.Figures;

/// <summary>Markers at (x, y) with optional asymmetric error bars (lengths, not bounds).</summary>
/// <param name="Label">Legend text, or empty.</param>
/// <param name="X">x values.</param>
/// <param name="Y">y values, same length.</param>
public sealed record PointSeries(string Label, IReadOnlyList<double> X, IReadOnlyList<double> Y) : SeriesSpec(Label)
{
    /// <summary>Lower x error (length ≥ 0) per point, or null.</summary>
    public IReadOnlyList<double>? XErrLow { get; init; }
    /// <summary>Upper x error per point, or null.</summary>
    public IReadOnlyList<double>? XErrHigh { get; init; }
    /// <summary>Lower y error per point, or null.</summary>
    public IReadOnlyList<double>? YErrLow { get; init; }
    /// <summary>Upper y error per point, or null.</summary>
    public IReadOnlyList<double>? YErrHigh { get; init; }
    /// <summary>Marker shape.</summary>
    public MarkerKind Marker { get; init; } = MarkerKind.Circle;
    /// <summary>Marker size in points (1/72 in).</summary>
    public double MarkerSize { get; init; } = 4;

    /// <inheritdoc />
    public override IEnumerable<double> XExtent() => Bounds(X, XErrLow, XErrHigh);
    /// <inheritdoc />
    public override IEnumerable<double> YExtent() => Bounds(Y, YErrLow, YErrHigh);

    private static IEnumerable<double> Bounds(IReadOnlyList<double> v, IReadOnlyList<double>? lo, IReadOnlyList<double>? hi)
    {
        for (int i = 0; i < v.Count; i++)
        {
            yield return v[i];
            if (lo is not null) yield return v[i] - lo[i];
            if (hi is not null) yield return v[i] + hi[i];
        }
    }
}

/// <summary>Marker shapes (filled unless named open).</summary>
public enum MarkerKind
{
    /// <summary>Filled circle.</summary>
    Circle,
    /// <summary>Open circle.</summary>
    OpenCircle,
    /// <summary>Filled square.</summary>
    Square,
    /// <summary>Filled diamond.</summary>
    Diamond,
    /// <summary>Filled triangle.</summary>
    Triangle,
}

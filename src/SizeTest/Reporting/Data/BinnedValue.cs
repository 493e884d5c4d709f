namespace SizeTest.Reporting.Data;

/// <summary>A statistic of the objects in one redshift bin with its bootstrap interval.</summary>
/// <param name="ZLow">Lower bin edge.</param>
/// <param name="ZHigh">Upper bin edge.</param>
/// <param name="Value">Statistic (median or mean).</param>
/// <param name="Lo">16th percentile of the bootstrap distribution of the statistic.</param>
/// <param name="Hi">84th percentile.</param>
/// <param name="Count">Objects in the bin.</param>
public sealed record BinnedValue(double ZLow, double ZHigh, double Value, double Lo, double Hi, int Count)
{
    /// <summary>Median redshift of the objects in the bin: where the point is drawn (NaN when not known: the bin centre is used).</summary>
    public double ZMedian { get; init; } = double.NaN;

    /// <summary><see cref="ZMedian"/>, or the geometric centre of the bin when it is not known.</summary>
    [System.Text.Json.Serialization.JsonIgnore]
    public double ZDrawn => double.IsFinite(ZMedian) ? ZMedian : (ZLow > 0 ? Math.Sqrt(ZLow * ZHigh) : 0.5 * (ZLow + ZHigh));
}

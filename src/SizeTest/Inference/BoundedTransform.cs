namespace SizeTest.Inference;

/// <summary>
/// Maps an unbounded vector u to a point inside the box [min, max] by the logistic function,
/// x = min + (max − min) / (1 + e^−u), so unconstrained optimisers respect the bounds.
/// </summary>
public sealed class BoundedTransform
{
    private readonly double[] _min, _max;

    /// <summary>Creates the transform for the given bounds.</summary>
    public BoundedTransform(IReadOnlyList<double> min, IReadOnlyList<double> max)
    {
        _min = min.ToArray();
        _max = max.ToArray();
    }

    /// <summary>Dimension.</summary>
    public int Dimension => _min.Length;

    /// <summary>x(u).</summary>
    public void ToBounded(ReadOnlySpan<double> u, Span<double> x)
    {
        for (int j = 0; j < u.Length; j++)
            x[j] = _min[j] + (_max[j] - _min[j]) / (1 + Math.Exp(-u[j]));
    }

    /// <summary>u(x); points on or beyond a bound map to ±30 (e^−30 ≈ 1e-13 of the range).</summary>
    public void ToUnbounded(ReadOnlySpan<double> x, Span<double> u)
    {
        for (int j = 0; j < x.Length; j++)
        {
            double p = (x[j] - _min[j]) / (_max[j] - _min[j]);
            u[j] = p <= 1e-13 ? -30 : p >= 1 - 1e-13 ? 30 : Math.Log(p / (1 - p));
        }
    }
}

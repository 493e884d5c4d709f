namespace SizeTest.Photometry;

/// <summary>
/// K(z) tabulated on a uniform redshift grid and read by linear interpolation, so that a
/// template K-correction costs a few integrals per grid node instead of per object.
/// With the default step 10⁻³ the interpolation error is below ~10⁻⁶ mag for smooth
/// templates (linear-interpolation error h² K''/8).
/// </summary>
public sealed class KCorrectionGrid
{
    private readonly double _z0;
    private readonly double _step;
    private readonly double[] _k;

    private KCorrectionGrid(double z0, double step, double[] k)
    {
        if (!(step > 0)) step = 1.0; // zMin == zMax: a constant
        _z0 = z0;
        _step = step;
        _k = k;
    }

    /// <summary>Lowest tabulated redshift.</summary>
    public double MinRedshift => _z0;

    /// <summary>Highest tabulated redshift.</summary>
    public double MaxRedshift => _z0 + _step * (_k.Length - 1);

    /// <summary>
    /// Tabulates <paramref name="k"/> from <paramref name="zMin"/> to <paramref name="zMax"/>; the Try
    /// function must succeed at every node.
    /// </summary>
    /// <returns>False (grid null) if a node fails; <paramref name="failedAt"/> is that redshift.</returns>
    public static bool TryTabulate(TryK k, double zMin, double zMax, double step, out KCorrectionGrid? grid, out double failedAt)
    {
        ArgumentNullException.ThrowIfNull(k);
        if (!(step > 0)) throw new ArgumentOutOfRangeException(nameof(step), step, "step must be > 0.");
        if (!(zMax >= zMin)) throw new ArgumentOutOfRangeException(nameof(zMax), zMax, "zMax must be ≥ zMin.");
        int n = Math.Max(2, (int)Math.Ceiling((zMax - zMin) / step - 1e-9) + 1);
        double h = (zMax - zMin) / (n - 1);   // ≤ step; the last node is exactly zMax
        var values = new double[n];
        for (int i = 0; i < n; i++)
        {
            double z = i == n - 1 ? zMax : zMin + i * h;
            if (!k(z, out values[i]))
            {
                grid = null;
                failedAt = z;
                return false;
            }
        }
        grid = new KCorrectionGrid(zMin, h, values);
        failedAt = double.NaN;
        return true;
    }

    /// <summary>Signature of a fallible K(z) in mag.</summary>
    public delegate bool TryK(double z, out double kMag);

    /// <summary>K(z) by linear interpolation; clamps to the end values outside the grid.</summary>
    public double At(double z)
    {
        double t = (z - _z0) / _step;
        if (t <= 0) return _k[0];
        int i = (int)t;
        if (i >= _k.Length - 1) return _k[^1];
        double f = t - i;
        return _k[i] + f * (_k[i + 1] - _k[i]);
    }
}

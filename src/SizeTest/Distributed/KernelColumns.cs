namespace SizeTest.Distributed;

/// <summary>
/// The per-object inputs of the Gaussian likelihood kernel, one array per quantity (structure of
/// arrays, 24 bytes per object): the observable y_i (ln θ_i for sizes; μ_i − K_i − A_i for surface
/// brightness, so per-object additive corrections leave the model side), its measurement variance σ_i²,
/// and the object's fractional position on a <see cref="LogRedshiftGrid"/>. Nothing here depends on the
/// parameter vector, so it is built once per sample (or per row group when streaming).
/// </summary>
public sealed class KernelColumns
{
    /// <summary>Wraps existing arrays (all of the same length); they are used, not copied.</summary>
    public KernelColumns(double[] value, double[] variance, double[] gridPosition, LogRedshiftGrid grid)
    {
        ArgumentNullException.ThrowIfNull(value);
        ArgumentNullException.ThrowIfNull(variance);
        ArgumentNullException.ThrowIfNull(gridPosition);
        ArgumentNullException.ThrowIfNull(grid);
        int n = value.Length;
        if (variance.Length != n || gridPosition.Length != n)
            throw new ArgumentException("All kernel columns must have the same length.");
        Value = value;
        Variance = variance;
        GridPosition = gridPosition;
        Grid = grid;
    }

    /// <summary>Number of objects.</summary>
    public int Count => Value.Length;

    /// <summary>The observable y_i (e.g. ln θ_i with θ in radians).</summary>
    public double[] Value { get; }

    /// <summary>Measurement variance σ_i² of y_i (≥ 0; σ_i² + σ_int² must be a positive normal double).</summary>
    public double[] Variance { get; }

    /// <summary>Fractional grid position of z_i (see <see cref="LogRedshiftGrid.Position"/>), in [0, Count−1].</summary>
    public double[] GridPosition { get; }

    /// <summary>The redshift grid the positions refer to.</summary>
    public LogRedshiftGrid Grid { get; }

    /// <summary>Builds the columns from redshifts, observables and their 1σ errors (all the same length).</summary>
    public static KernelColumns Build(ReadOnlySpan<double> z, ReadOnlySpan<double> value, ReadOnlySpan<double> error, LogRedshiftGrid grid)
    {
        ArgumentNullException.ThrowIfNull(grid);
        int n = z.Length;
        if (value.Length != n || error.Length != n) throw new ArgumentException("z, value and error must have the same length.");
        var y = new double[n];
        var s2 = new double[n];
        var t = new double[n];
        for (int i = 0; i < n; i++)
        {
            y[i] = value[i];
            s2[i] = error[i] * error[i];
            t[i] = grid.Position(z[i]);
        }
        return new KernelColumns(y, s2, t, grid);
    }
}

using System.Runtime.CompilerServices;
using System.Runtime.Intrinsics;
using System.Runtime.Intrinsics.X86;

namespace SizeTest.Distributed;

/// <summary>
/// The Gaussian log-likelihood of an observable against a model that depends on redshift only,
/// evaluated as a sum over a row slice [start, end) so that slices on threads or MPI ranks combine by addition.
/// </summary>
/// <remarks>
/// ln L = −½ Σ_i [ r_i² / (σ_i² + σ_int²) + ln(2π(σ_i² + σ_int²)) ], r_i = y_i − m(z_i)
/// (Gaussian likelihood with intrinsic scatter, common practice; docs/science.md §1.7).
/// m(z) is given by its values at the nodes of a <see cref="LogRedshiftGrid"/>, computed once per
/// parameter vector (e.g. <see cref="AngularSizeModelGrid.Fill"/>), and linearly interpolated at each
/// object's grid position. For angular sizes y = ln θ and m = ln R0 + a ln(1+z) − ln D_A(z); for surface
/// brightness y = μ − K − A and m = μ0 + 2.5(n − b) log10(1+z).
/// The vectorised path uses 256-bit vectors (AVX2 gathers for the grid look-up where available) and an own
/// vector logarithm; <see cref="LogLikelihoodScalar"/> is the plain reference it is tested against.
/// </remarks>
public static class GaussianGridKernel
{
    /// <summary>Rows per parallel work item; chunk boundaries are fixed so results do not depend on the thread count.</summary>
    public const int ChunkRows = 1 << 15;

    private static readonly double LnTwoPi = Math.Log(2 * Math.PI);

    /// <summary>
    /// Plain scalar reference: ln L over rows [start, end). <paramref name="modelGrid"/> holds the model m(z_k)
    /// at the grid nodes; <paramref name="sigmaInt"/> is the intrinsic scatter in the units of y.
    /// </summary>
    public static double LogLikelihoodScalar(KernelColumns columns, int start, int end, ReadOnlySpan<double> modelGrid,
        double sigmaInt)
    {
        CheckArguments(columns, start, end, modelGrid);
        double s2Int = sigmaInt * sigmaInt;
        double chi2 = 0, logDet = 0;
        for (int i = start; i < end; i++)
        {
            double r = columns.Value[i] - LogRedshiftGrid.Interpolate(modelGrid, columns.GridPosition[i]);
            double v = columns.Variance[i] + s2Int;
            chi2 += r * r / v;
            logDet += Math.Log(v);
        }
        return -0.5 * (chi2 + logDet + (end - start) * LnTwoPi);
    }

    /// <summary>Vectorised ln L over rows [start, end) on the calling thread (same arguments as <see cref="LogLikelihoodScalar"/>).</summary>
    public static double LogLikelihood(KernelColumns columns, int start, int end, ReadOnlySpan<double> modelGrid,
        double sigmaInt)
    {
        CheckArguments(columns, start, end, modelGrid);
        var (chi2, logDet) = Core(columns, start, end, modelGrid, sigmaInt * sigmaInt);
        return -0.5 * (chi2 + logDet + (end - start) * LnTwoPi);
    }

    /// <summary>
    /// Vectorised ln L over rows [start, end) on all cores: fixed chunks of <see cref="ChunkRows"/> rows
    /// (aligned to <paramref name="start"/>), partial sums added in chunk order, so the result is the
    /// same for any thread count. <paramref name="maxThreads"/> ≤ 0 means all cores.
    /// </summary>
    public static double LogLikelihoodParallel(KernelColumns columns, int start, int end, double[] modelGrid,
        double sigmaInt, int maxThreads = 0)
    {
        CheckArguments(columns, start, end, modelGrid);
        int n = end - start;
        int chunks = (n + ChunkRows - 1) / ChunkRows;
        if (chunks <= 1) return LogLikelihood(columns, start, end, modelGrid, sigmaInt);
        var partial = new double[chunks];
        double s2Int = sigmaInt * sigmaInt;
        var options = new ParallelOptions { MaxDegreeOfParallelism = maxThreads > 0 ? maxThreads : Environment.ProcessorCount };
        int workers = Math.Min(chunks, options.MaxDegreeOfParallelism);
        // Static partition: worker w takes chunks w, w+workers, ... (no per-chunk scheduling cost).
        Parallel.For(0, workers, options, w =>
        {
            for (int c = w; c < chunks; c += workers)
            {
                int a = start + c * ChunkRows;
                int b = Math.Min(end, a + ChunkRows);
                var (chi2, logDet) = Core(columns, a, b, modelGrid, s2Int);
                partial[c] = chi2 + logDet;
            }
        });
        double sum = 0;
        for (int c = 0; c < chunks; c++) sum += partial[c];
        return -0.5 * (sum + n * LnTwoPi);
    }

    private static void CheckArguments(KernelColumns columns, int start, int end, ReadOnlySpan<double> modelGrid)
    {
        ArgumentNullException.ThrowIfNull(columns);
        if (start < 0 || end < start || end > columns.Count) throw new ArgumentOutOfRangeException(nameof(end), $"Row slice [{start}, {end}) is outside [0, {columns.Count}).");
        if (modelGrid.Length != columns.Grid.Count) throw new ArgumentException("The grid values must have one entry per grid node.", nameof(modelGrid));
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static unsafe (double Chi2, double LogDet) Core(KernelColumns columns, int start, int end, ReadOnlySpan<double> grid, double s2Int)
    {
        double chi2 = 0, logDet = 0;
        int i = start;
        fixed (double* py = columns.Value, ps = columns.Variance, pt = columns.GridPosition, pg = grid)
        {
            if (Vector256.IsHardwareAccelerated && end - start >= 8)
            {
                var vs2 = Vector256.Create(s2Int);
                var vmax = Vector256.Create((double)(grid.Length - 2));
                var accChi0 = Vector256<double>.Zero; var accChi1 = Vector256<double>.Zero;
                var accDet0 = Vector256<double>.Zero; var accDet1 = Vector256<double>.Zero;
                bool gather = Avx2.IsSupported;
                for (; i + 8 <= end; i += 8)
                {
                    Step(py, ps, pt, pg, i, vs2, vmax, gather, ref accChi0, ref accDet0);
                    Step(py, ps, pt, pg, i + 4, vs2, vmax, gather, ref accChi1, ref accDet1);
                }
                chi2 = Vector256.Sum(accChi0 + accChi1);
                logDet = Vector256.Sum(accDet0 + accDet1);
            }
            for (; i < end; i++)
            {
                double t = pt[i];
                int j = (int)t;
                if (j > grid.Length - 2) j = grid.Length - 2;
                double w = t - j;
                double r = py[i] - (pg[j] + w * (pg[j + 1] - pg[j]));
                double v = ps[i] + s2Int;
                chi2 += r * r / v;
                logDet += Math.Log(v);
            }
        }
        return (chi2, logDet);
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static unsafe void Step(double* py, double* ps, double* pt, double* pg, int i,
        Vector256<double> vs2, Vector256<double> vmax, bool gather,
        ref Vector256<double> accChi, ref Vector256<double> accDet)
    {
        var t = Vector256.Load(pt + i);
        var tf = Vector256.Min(Vector256.Floor(t), vmax);
        var w = t - tf;
        Vector256<double> g0, g1;
        if (gather)
        {
            var idx = Avx.ConvertToVector128Int32WithTruncation(tf);
            g0 = Avx2.GatherVector256(pg, idx, 8);
            g1 = Avx2.GatherVector256(pg + 1, idx, 8);
        }
        else
        {
            int j0 = (int)tf.GetElement(0), j1 = (int)tf.GetElement(1), j2 = (int)tf.GetElement(2), j3 = (int)tf.GetElement(3);
            g0 = Vector256.Create(pg[j0], pg[j1], pg[j2], pg[j3]);
            g1 = Vector256.Create(pg[j0 + 1], pg[j1 + 1], pg[j2 + 1], pg[j3 + 1]);
        }
        var r = Vector256.Load(py + i) - (g0 + w * (g1 - g0));
        var v = Vector256.Load(ps + i) + vs2;
        accChi += r * r / v;
        accDet += VectorLog.Log(v);
    }
}

using System.Numerics;
using System.Runtime.InteropServices;

namespace SizeTest.Inference.Survey;

/// <summary>
/// ln D_A and d ln D_A/dz at each object's posterior mean z̄ for the block-vectorised linearised kernels
/// (<see cref="LinearisedRedshiftKernel"/>, <see cref="LinearisedJointKernel"/>): fixed per object (a fixed cosmology), or per block
/// from the redshift grid's node values through the value and slope stencils (<see cref="RedshiftGridSlope"/>). Also the kernels'
/// vector helpers: arrays padded by one vector, the lane index, unaligned loads and stores.
/// </summary>
internal sealed class LinearisedDistances
{
    /// <summary>Doubles per vector.</summary>
    public static readonly int Lanes = Vector<double>.Count;

    private readonly double[]? _lnDa, _slope, _lnz, _invZ;

    /// <summary>The grid (null for a fixed cosmology).</summary>
    public RedshiftGrid? Grid { get; }

    /// <summary>The slope stencil's 4 weights per object on <see cref="Grid"/>.</summary>
    public double[]? SlopeWeights { get; }

    /// <summary>Binds fixed distances and slopes, or the grid with its slope stencils.</summary>
    public LinearisedDistances(int n, double[] lnz, double[]? lnDaFixed, double[]? slopeFixed, RedshiftGrid? grid, double[]? slopeWeights)
    {
        if ((lnDaFixed is null || slopeFixed is null) && (grid is null || slopeWeights is null))
            throw new ArgumentException("the linearised marginal needs fixed distances and slopes or a grid with its slope stencils");
        if (lnDaFixed is not null && slopeFixed is not null)
        {
            _lnDa = Padded(lnDaFixed, n, 0);
            _slope = Padded(slopeFixed, n, 0);
        }
        else
        {
            _lnz = lnz;
            _invZ = lnz.Select(v => Math.Exp(-v)).ToArray();
            Grid = grid;
            SlopeWeights = slopeWeights;
        }
    }

    /// <summary>Whether the distances come from the grid (then <see cref="Fill"/> per block).</summary>
    public bool OnGrid => Grid is not null;

    /// <summary>Grid: ln D_A and its slope of objects [b0, b0 + nb) into the buffers (padded with 0). Fixed: nothing.</summary>
    public void Fill(double[]? g, int b0, int nb, int padded, double[]? lnDa, double[]? slope)
    {
        if (Grid is not null) RedshiftGridSlope.Distances(Grid, SlopeWeights!, _lnz!, _invZ!, g!, b0, nb, padded, lnDa!, slope!);
    }

    /// <summary>ln D_A of the block starting at b0 (the filled buffer on the grid).</summary>
    public ReadOnlySpan<double> LnDa(int b0, double[]? buffer) => Grid is not null ? buffer.AsSpan() : _lnDa.AsSpan(b0);

    /// <summary>d ln D_A/dz of the block starting at b0 (the filled buffer on the grid).</summary>
    public ReadOnlySpan<double> Slope(int b0, double[]? buffer) => Grid is not null ? buffer.AsSpan() : _slope.AsSpan(b0);

    /// <summary><paramref name="v"/>'s first n values followed by one vector of <paramref name="pad"/>.</summary>
    public static double[] Padded(double[] v, int n, double pad)
    {
        var p = new double[n + Lanes];
        Array.Copy(v, p, n);
        Array.Fill(p, pad, n, Lanes);
        return p;
    }

    /// <summary>The vector 0, 1, …, Lanes − 1.</summary>
    public static Vector<double> LaneIndex()
    {
        Span<double> l = stackalloc double[Lanes];
        for (int k = 0; k < Lanes; k++) l[k] = k;
        return new Vector<double>(l);
    }

    /// <summary>The vector at s[t…].</summary>
    public static Vector<double> Load(ReadOnlySpan<double> s, int t) => Vector.LoadUnsafe(ref MemoryMarshal.GetReference(s), (nuint)t);

    /// <summary>Stores v at a[t…].</summary>
    public static void Store(Vector<double> v, double[] a, int t) => v.StoreUnsafe(ref MemoryMarshal.GetArrayDataReference(a), (nuint)t);
}

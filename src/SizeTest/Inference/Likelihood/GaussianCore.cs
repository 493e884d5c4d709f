using System.Numerics;
using System.Runtime.InteropServices;

namespace SizeTest.Inference.Likelihood;

/// <summary>
/// The one vectorised Gaussian core of the likelihood kernels: Σ [r²/v + ln v] with r = y − (c0 + slope·x − offset) and
/// v = s2 + extra (Gaussian log density with intrinsic scatter, common practice; docs/science.md §1.7), using
/// System.Numerics vectors. With uniform s2 the logarithm is taken once. The size model passes y = ln θ, x = ln(1+z),
/// offset = ln D_A; the SB model y = μ, x = log10(1+z), offset = −(K + A).
/// </summary>
internal static class GaussianCore
{
    public const double HalfLn2Pi = 0.91893853320467274;

    public static double Sum(ReadOnlySpan<double> y, ReadOnlySpan<double> x, ReadOnlySpan<double> offset, ReadOnlySpan<double> s2,
        double c0, double slope, double extra, bool uniformS2)
    {
        int n = y.Length, i = 0;
        double q = 0, l = 0;
        if (uniformS2)
        {
            double var = (n > 0 ? s2[0] : 0) + extra, inv = 1 / var;
            if (Vector.IsHardwareAccelerated && n >= Vector<double>.Count)
            {
                var vc = new Vector<double>(c0);
                var vs = new Vector<double>(slope);
                var acc = Vector<double>.Zero;
                var yv = MemoryMarshal.Cast<double, Vector<double>>(y);
                var xv = MemoryMarshal.Cast<double, Vector<double>>(x);
                var ov = MemoryMarshal.Cast<double, Vector<double>>(offset);
                for (int k = 0; k < yv.Length; k++)
                {
                    var r = yv[k] - (vc + vs * xv[k] - ov[k]);
                    acc += r * r;
                }
                q = Vector.Sum(acc);
                i = yv.Length * Vector<double>.Count;
            }
            for (; i < n; i++)
            {
                double r = y[i] - (c0 + slope * x[i] - offset[i]);
                q += r * r;
            }
            return q * inv + n * Math.Log(var);
        }
        if (Vector.IsHardwareAccelerated && n >= Vector<double>.Count)
        {
            var vc = new Vector<double>(c0);
            var vs = new Vector<double>(slope);
            var ve = new Vector<double>(extra);
            var accQ = Vector<double>.Zero;
            var accL = Vector<double>.Zero;
            var yv = MemoryMarshal.Cast<double, Vector<double>>(y);
            var xv = MemoryMarshal.Cast<double, Vector<double>>(x);
            var ov = MemoryMarshal.Cast<double, Vector<double>>(offset);
            var sv = MemoryMarshal.Cast<double, Vector<double>>(s2);
            for (int k = 0; k < yv.Length; k++)
            {
                var r = yv[k] - (vc + vs * xv[k] - ov[k]);
                var var = sv[k] + ve;
                accQ += r * r / var;
                accL += Vector.Log(var);
            }
            q = Vector.Sum(accQ);
            l = Vector.Sum(accL);
            i = yv.Length * Vector<double>.Count;
        }
        for (; i < n; i++)
        {
            double r = y[i] - (c0 + slope * x[i] - offset[i]);
            double var = s2[i] + extra;
            q += r * r / var;
            l += Math.Log(var);
        }
        return q + l;
    }

    /// <summary>
    /// The same sum and, per row, the residual partials: writes d_i = r_i/v_i (∂ of −½[r²/v + ln v] with respect to the
    /// mean) into <paramref name="dMean"/> and returns also Σ ∂/∂v = Σ ½(r²/v² − 1/v) in <paramref name="dVarSum"/>,
    /// Σ d and Σ d·x in <paramref name="dSum"/>, <paramref name="dxSum"/> (vectorised).
    /// </summary>
    public static double SumWithPartials(ReadOnlySpan<double> y, ReadOnlySpan<double> x, ReadOnlySpan<double> offset, ReadOnlySpan<double> s2,
        double c0, double slope, double extra, bool uniformS2, Span<double> dMean, out double dSum, out double dxSum, out double dVarSum)
    {
        int n = y.Length, i = 0;
        double q = 0, l = 0, sd = 0, sdx = 0, sv = 0;
        if (Vector.IsHardwareAccelerated && n >= Vector<double>.Count)
        {
            var vc = new Vector<double>(c0);
            var vs = new Vector<double>(slope);
            var ve = new Vector<double>(extra);
            var half = new Vector<double>(0.5);
            Vector<double> accQ = Vector<double>.Zero, accL = Vector<double>.Zero, accD = Vector<double>.Zero, accDx = Vector<double>.Zero, accV = Vector<double>.Zero;
            var yv = MemoryMarshal.Cast<double, Vector<double>>(y);
            var xv = MemoryMarshal.Cast<double, Vector<double>>(x);
            var ov = MemoryMarshal.Cast<double, Vector<double>>(offset);
            var s2v = MemoryMarshal.Cast<double, Vector<double>>(s2);
            var dv = MemoryMarshal.Cast<double, Vector<double>>(dMean);
            for (int k = 0; k < yv.Length; k++)
            {
                var r = yv[k] - (vc + vs * xv[k] - ov[k]);
                var inv = Vector<double>.One / (s2v[k] + ve);
                var d = r * inv;
                var dr = d * r;
                accQ += dr;
                if (!uniformS2) accL += Vector.Log(s2v[k] + ve);
                accD += d;
                accDx += d * xv[k];
                accV += half * (d * d - inv);
                dv[k] = d;
            }
            q = Vector.Sum(accQ); l = Vector.Sum(accL); sd = Vector.Sum(accD); sdx = Vector.Sum(accDx); sv = Vector.Sum(accV);
            i = yv.Length * Vector<double>.Count;
        }
        for (; i < n; i++)
        {
            double r = y[i] - (c0 + slope * x[i] - offset[i]);
            double var = s2[i] + extra, inv = 1 / var, d = r * inv;
            q += d * r;
            if (!uniformS2) l += Math.Log(var);
            sd += d; sdx += d * x[i]; sv += 0.5 * (d * d - inv);
            dMean[i] = d;
        }
        if (uniformS2) l = n * Math.Log((n > 0 ? s2[0] : 0) + extra);
        dSum = sd; dxSum = sdx; dVarSum = sv;
        return q + l;
    }
}

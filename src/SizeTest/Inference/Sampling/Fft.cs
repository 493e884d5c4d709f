using System.Buffers;
using System.Collections.Concurrent;

namespace SizeTest.Inference.Sampling;

/// <summary>
/// In-place iterative radix-2 complex FFT on separate real and imaginary arrays (Cooley &amp;
/// Tukey 1965, Math. Comp. 19, 297), and FFT autocovariances of two real series at once
/// (packed as x + i y; Press et al. 2007, Numerical Recipes 3rd ed. §12.3.2). Used by the chain
/// diagnostics, which need many autocovariances of long chains.
/// </summary>
internal static class Fft
{
    private static readonly ConcurrentDictionary<int, double[]> CosTables = new();
    private static readonly ConcurrentDictionary<int, double[]> SinTables = new();

    /// <summary>Unnormalised transform: X_k = Σ_j x_j e^{∓2πijk/n} (minus sign forward). Length must be a power of two.</summary>
    public static void Transform(Span<double> re, Span<double> im, bool inverse)
    {
        int n = re.Length;
        if (n != im.Length || (n & (n - 1)) != 0) throw new ArgumentException("The FFT length must be a power of two and the same for both parts.");
        if (n < 2) return;
        for (int i = 1, j = 0; i < n; i++)
        {
            int bit = n >> 1;
            for (; (j & bit) != 0; bit >>= 1) j ^= bit;
            j ^= bit;
            if (i < j)
            {
                (re[i], re[j]) = (re[j], re[i]);
                (im[i], im[j]) = (im[j], im[i]);
            }
        }
        var cos = CosTables.GetOrAdd(n, static m => [.. Enumerable.Range(0, m / 2).Select(k => Math.Cos(2 * Math.PI * k / m))]);
        var sin = SinTables.GetOrAdd(n, static m => [.. Enumerable.Range(0, m / 2).Select(k => Math.Sin(2 * Math.PI * k / m))]);
        double sign = inverse ? 1.0 : -1.0;
        for (int len = 2; len <= n; len <<= 1)
        {
            int half = len >> 1, stride = n / len;
            for (int i = 0; i < n; i += len)
            {
                for (int k = 0; k < half; k++)
                {
                    double wr = cos[k * stride], wi = sign * sin[k * stride];
                    int a = i + k, b = a + half;
                    double xr = re[b] * wr - im[b] * wi, xi = re[b] * wi + im[b] * wr;
                    re[b] = re[a] - xr;
                    im[b] = im[a] - xi;
                    re[a] += xr;
                    im[a] += xi;
                }
            }
        }
    }

    /// <summary>
    /// Biased autocovariances γ(t) = (1/n) Σ_{i&lt;n−t} (x_i − x̄)(x_{i+t} − x̄) of <paramref name="x"/> and,
    /// if not empty, of <paramref name="y"/> (same length), with one forward and one inverse FFT of
    /// length ≥ 2n (zero padding removes the circular wrap-around).
    /// </summary>
    public static void AutocovariancePair(ReadOnlySpan<double> x, ReadOnlySpan<double> y, Span<double> outX, Span<double> outY)
    {
        int n = x.Length;
        bool pair = !y.IsEmpty;
        if (pair && y.Length != n) throw new ArgumentException("Both series must have the same length.");
        if (n == 0) return;
        int m = 1;
        while (m < 2 * n) m <<= 1;
        var reArr = ArrayPool<double>.Shared.Rent(m);
        var imArr = ArrayPool<double>.Shared.Rent(m);
        try
        {
            var re = reArr.AsSpan(0, m);
            var im = imArr.AsSpan(0, m);
            re.Clear();
            im.Clear();
            double mx = 0, my = 0;
            for (int i = 0; i < n; i++) mx += x[i];
            mx /= n;
            for (int i = 0; i < n; i++) re[i] = x[i] - mx;
            if (pair)
            {
                for (int i = 0; i < n; i++) my += y[i];
                my /= n;
                for (int i = 0; i < n; i++) im[i] = y[i] - my;
            }
            Transform(re, im, inverse: false);
            // Separate the two spectra: X_k = (Z_k + conj Z_{m−k})/2, Y_k = (Z_k − conj Z_{m−k})/(2i);
            // store |X_k|² + i |Y_k|² (both real and even in k, so their inverse transforms are real).
            for (int k = 0; k <= m / 2; k++)
            {
                int j = (m - k) & (m - 1);
                double ar = re[k], ai = im[k], br = re[j], bi = im[j];
                double px = ((ar + br) * (ar + br) + (ai - bi) * (ai - bi)) / 4.0;
                double py = ((ai + bi) * (ai + bi) + (ar - br) * (ar - br)) / 4.0;
                re[k] = px; im[k] = py;
                re[j] = px; im[j] = py;
            }
            Transform(re, im, inverse: true);
            double scale = 1.0 / ((double)m * n);
            for (int t = 0; t < n; t++) outX[t] = re[t] * scale;
            if (pair) for (int t = 0; t < n; t++) outY[t] = im[t] * scale;
        }
        finally
        {
            ArrayPool<double>.Shared.Return(reArr);
            ArrayPool<double>.Shared.Return(imArr);
        }
    }
}

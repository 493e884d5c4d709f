namespace SizeTest.Cosmology;

/// <summary>
/// A function of x ≥ 0 stored as piecewise Chebyshev series on equal panels
/// [jh, (j+1)h]: evaluation is one index computation plus a Clenshaw recurrence, with no
/// search and no dependence on the order of the queries. Used by <see cref="FlrwModel"/>
/// for its fast distances (x = ln(1+z)).
/// </summary>
/// <remarks>
/// Two kinds of table are built here: the running integral F(x) = ∫0^x g of a smooth
/// integrand (g interpolated at n Chebyshev points of the first kind per panel, the
/// interpolant integrated term by term, so the panel series of F has degree n and the
/// panels join continuously), and the interpolant of a smooth function f itself.
/// The size of the last two Chebyshev coefficients of every panel, relative to the panel's
/// coefficient sum, is returned as <see cref="TailRatio"/>: for an analytic function the
/// coefficients decay geometrically, so this bounds the interpolation error (Trefethen 2013,
/// Approximation Theory and Approximation Practice, ch. 8). The caller halves the panel
/// width when the bound is not met. Immutable; extension returns a new table.
/// </remarks>
internal sealed class ChebyshevPanelTable
{
    private readonly double[] _coefficients;
    private readonly double[] _monomials;

    private ChebyshevPanelTable(double panelWidth, int stride, double[] coefficients, int panelCount, double carry, double tailRatio)
    {
        _monomials = ToMonomials(coefficients, stride, panelCount);
        PanelWidth = panelWidth;
        InversePanelWidth = 1.0 / panelWidth;
        Stride = stride;
        _coefficients = coefficients;
        PanelCount = panelCount;
        Carry = carry;
        TailRatio = tailRatio;
    }

    /// <summary>Panel width h in x.</summary>
    public double PanelWidth { get; }

    /// <summary>1/h.</summary>
    public double InversePanelWidth { get; }

    /// <summary>Coefficients per panel (series degree + 1).</summary>
    public int Stride { get; }

    /// <summary>Number of panels built.</summary>
    public int PanelCount { get; }

    /// <summary>Largest x covered.</summary>
    public double XMax => PanelCount * PanelWidth;

    /// <summary>For an integral table, F at <see cref="XMax"/>; otherwise 0.</summary>
    public double Carry { get; }

    /// <summary>Largest relative size of the two last Chebyshev coefficients over all panels.</summary>
    public double TailRatio { get; }

    /// <summary>The coefficients, panel after panel.</summary>
    public ReadOnlySpan<double> Coefficients => _coefficients.AsSpan(0, PanelCount * Stride);

    /// <summary>
    /// The same panel polynomials in the monomial basis of t ∈ [−1, 1] (for the hot loops).
    /// Conditioning is benign because the Chebyshev coefficients decay fast (ρ ≳ 10 per
    /// degree), so the monomial coefficients decay too.
    /// </summary>
    public ReadOnlySpan<double> Monomials => _monomials.AsSpan(0, PanelCount * Stride);

    /// <summary>Evaluates the table at 0 ≤ x ≤ <see cref="XMax"/> (slightly beyond uses the last panel).</summary>
    public double Evaluate(double x)
    {
        int j = (int)(x * InversePanelWidth);
        if (j >= PanelCount) j = PanelCount - 1;
        double t = 2.0 * (x * InversePanelWidth - j) - 1.0;
        return Clenshaw(_coefficients.AsSpan(j * Stride, Stride), t);
    }

    private static double[] ToMonomials(double[] chebyshev, int stride, int panelCount)
    {
        var result = new double[panelCount * stride];
        // Monomial coefficients of T_0..T_{stride-1} by T_{k+1} = 2t T_k − T_{k−1}.
        var basis = new double[stride * stride];
        basis[0] = 1.0;
        if (stride > 1) basis[stride + 1] = 1.0;
        for (int k = 2; k < stride; k++)
            for (int p = 0; p < stride; p++)
                basis[k * stride + p] = (p > 0 ? 2.0 * basis[(k - 1) * stride + p - 1] : 0.0) - basis[(k - 2) * stride + p];
        for (int j = 0; j < panelCount; j++)
            for (int k = 0; k < stride; k++)
            {
                double c = chebyshev[j * stride + k];
                if (c == 0.0) continue;
                for (int p = 0; p <= k; p++) result[j * stride + p] += c * basis[k * stride + p];
            }
        return result;
    }

    /// <summary>Clenshaw recurrence for Σ c_k T_k(t).</summary>
    public static double Clenshaw(ReadOnlySpan<double> c, double t)
    {
        double t2 = 2.0 * t, b1 = 0.0, b2 = 0.0;
        for (int k = c.Length - 1; k >= 1; k--)
        {
            double b0 = Math.FusedMultiplyAdd(t2, b1, c[k] - b2);
            b2 = b1;
            b1 = b0;
        }
        return Math.FusedMultiplyAdd(t, b1, c[0] - b2);
    }

    /// <summary>Builds the running integral of <paramref name="integrand"/> over <paramref name="panelCount"/> panels.</summary>
    public static ChebyshevPanelTable Integral(Func<double, double> integrand, double panelWidth, int nodes, int panelCount)
        => Build(integrand, panelWidth, nodes, panelCount, integrate: true, start: null);

    /// <summary>Builds the panelwise interpolant of <paramref name="function"/>.</summary>
    public static ChebyshevPanelTable Interpolant(Func<double, double> function, double panelWidth, int nodes, int panelCount)
        => Build(function, panelWidth, nodes, panelCount, integrate: false, start: null);

    /// <summary>Returns a table with panels added so that it covers <paramref name="panelCount"/> panels.</summary>
    public ChebyshevPanelTable ExtendedTo(Func<double, double> function, int panelCount, bool integrate)
        => panelCount <= PanelCount ? this : Build(function, PanelWidth, integrate ? Stride - 1 : Stride, panelCount, integrate, this);

    private static ChebyshevPanelTable Build(Func<double, double> f, double h, int n, int panelCount, bool integrate, ChebyshevPanelTable? start)
    {
        int stride = integrate ? n + 1 : n;
        var coefficients = new double[panelCount * stride];
        int first = 0;
        double carry = 0.0, tail = 0.0;
        if (start is not null)
        {
            start.Coefficients.CopyTo(coefficients);
            first = start.PanelCount;
            carry = start.Carry;
            tail = start.TailRatio;
        }
        var (nodeT, cosTable) = NodeTables(n);
        Span<double> values = stackalloc double[n];
        Span<double> a = stackalloc double[n + 2];
        for (int j = first; j < panelCount; j++)
        {
            double x0 = j * h;
            for (int k = 0; k < n; k++)
                values[k] = f(x0 + 0.5 * h * (nodeT[k] + 1.0));
            a.Clear();
            double scale = 0.0;
            for (int m = 0; m < n; m++)
            {
                double s = 0.0;
                for (int k = 0; k < n; k++) s += values[k] * cosTable[m * n + k];
                a[m] = (m == 0 ? 1.0 : 2.0) / n * s;
                scale += Math.Abs(a[m]);
            }
            double panelTail = scale > 0 ? (Math.Abs(a[n - 1]) + Math.Abs(a[n - 2])) / scale : 0.0;
            if (!double.IsFinite(panelTail)) panelTail = double.PositiveInfinity;
            tail = Math.Max(tail, panelTail);
            var dst = coefficients.AsSpan(j * stride, stride);
            if (!integrate)
            {
                a[..n].CopyTo(dst);
                continue;
            }
            // Term-by-term integral of Σ a_m T_m(t), scaled by dx/dt = h/2.
            double half = 0.5 * h;
            dst[1] = half * (a[0] - 0.5 * a[2]);
            for (int k = 2; k <= n; k++) dst[k] = half * (a[k - 1] - a[k + 1]) / (2.0 * k);
            double atMinusOne = 0.0, atPlusOne = 0.0;
            for (int k = 1; k <= n; k++)
            {
                atMinusOne += (k % 2 == 0 ? 1.0 : -1.0) * dst[k];
                atPlusOne += dst[k];
            }
            dst[0] = carry - atMinusOne;
            carry = dst[0] + atPlusOne;
        }
        return new ChebyshevPanelTable(h, stride, coefficients, panelCount, integrate ? carry : 0.0, tail);
    }

    private static readonly Dictionary<int, (double[] Nodes, double[] Cos)> NodeCache = new();

    private static (double[] Nodes, double[] Cos) NodeTables(int n)
    {
        lock (NodeCache)
        {
            if (NodeCache.TryGetValue(n, out var cached)) return cached;
            var nodes = new double[n];
            var cos = new double[n * n];
            for (int k = 0; k < n; k++) nodes[k] = Math.Cos(Math.PI * (k + 0.5) / n);
            for (int m = 0; m < n; m++)
                for (int k = 0; k < n; k++)
                    cos[m * n + k] = Math.Cos(Math.PI * m * (k + 0.5) / n);
            NodeCache[n] = (nodes, cos);
            return (nodes, cos);
        }
    }
}

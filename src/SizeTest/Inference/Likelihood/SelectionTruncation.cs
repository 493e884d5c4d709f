
using SizeTest.Foundation.Angles;

namespace SizeTest.Inference.Likelihood;

/// <summary>
/// The selection truncation: the log-probability that an object at its redshift passes the cuts under the model,
/// ln P(pass), and its derivatives with respect to the model quantities (m_t, m_μ, V_t, V_μ, C).
/// </summary>
/// <remarks>
/// <para>Each cut is a linear functional of the deviations (ln θ − m_t, μ − m_μ): w = c_x(ln θ − m_t) + c_y(μ − m_μ) &lt; h
/// with h = K − c_x m_t − c_y m_μ: the minimum size (c = (−1, 0), K = −ln θ_min), the SB limit (c = (0, 1), K = μ_lim) and the
/// magnitude limit m = μ − (5/ln10) ln θ″ − 2.5 log10(2π) (c = (−5/ln10, 1), K = m_lim − offset). With s² = cᵀΣc
/// (Σ = [[V_t, C], [C, V_μ]]) one cut gives ln Φ(h/s), two give ln Φ₂(h₀/s₀, h₁/s₁; ρ), ρ = c₀ᵀΣc₁/(s₀s₁)
/// (truncated Gaussian, common practice; Φ₂ by Genz 2004).</para>
/// <para>Derivatives: d ln Φ(u)/du = φ(u)/Φ(u); for Φ₂ the closed forms of <see cref="NormalMath.LogBivariatePhi(double, double, double, out double, out double, out double)"/>;
/// ∂u/∂h = 1/s, ∂u/∂(s²) = −u/(2s²), ∂ρ/∂Σ = ∂(c₀ᵀΣc₁)/∂Σ/(s₀s₁) − (ρ/2)(∂s₀²/∂Σ/s₀² + ∂s₁²/∂Σ/s₁²).</para>
/// </remarks>
internal sealed class SelectionTruncation
{
    private static readonly double MagFromLnTheta = -5.0 / ModelPoint.Ln10;
    private static readonly double MagOffset = -5.0 / ModelPoint.Ln10 * Math.Log(AngleUnits.ArcsecPerRadian) - 2.5 * Math.Log10(2 * Math.PI);

    private readonly double[] _cx, _cy, _k;

    private SelectionTruncation(double[] cx, double[] cy, double[] k) { _cx = cx; _cy = cy; _k = k; }

    /// <summary>The truncation for the cuts, or null when there are none.</summary>
    public static SelectionTruncation? For(SelectionLimits cuts)
    {
        var cx = new List<double>(); var cy = new List<double>(); var k = new List<double>();
        if (cuts.MinThetaArcsec is { } t) { cx.Add(-1); cy.Add(0); k.Add(-Math.Log(t * AngleUnits.RadiansPerArcsec)); }
        if (cuts.SbLimit is { } sb) { cx.Add(0); cy.Add(1); k.Add(sb); }
        if (cuts.MagLimit is { } m) { cx.Add(MagFromLnTheta); cy.Add(1); k.Add(m - MagOffset); }
        return cx.Count == 0 ? null : new SelectionTruncation(cx.ToArray(), cy.ToArray(), k.ToArray());
    }

    /// <summary>ln P(pass) for one object.</summary>
    public double LogPass(double mt, double mm, double vt, double vm, double c)
    {
        double s0 = Math.Sqrt(_cx[0] * _cx[0] * vt + 2 * _cx[0] * _cy[0] * c + _cy[0] * _cy[0] * vm);
        double h0 = _k[0] - _cx[0] * mt - _cy[0] * mm;
        if (_k.Length == 1) return NormalMath.LogPhi(h0 / s0);
        double s1 = Math.Sqrt(_cx[1] * _cx[1] * vt + 2 * _cx[1] * _cy[1] * c + _cy[1] * _cy[1] * vm);
        double h1 = _k[1] - _cx[1] * mt - _cy[1] * mm;
        double rho = (_cx[0] * _cx[1] * vt + (_cx[0] * _cy[1] + _cy[0] * _cx[1]) * c + _cy[0] * _cy[1] * vm) / (s0 * s1);
        return NormalMath.LogBivariatePhi(h0 / s0, h1 / s1, rho);
    }

    /// <summary>ln P(pass) and its partial derivatives with respect to m_t, m_μ, V_t, V_μ, C.</summary>
    public double LogPass(double mt, double mm, double vt, double vm, double c,
        out double dmt, out double dmm, out double dvt, out double dvm, out double dc)
    {
        double cx0 = _cx[0], cy0 = _cy[0];
        double s02 = cx0 * cx0 * vt + 2 * cx0 * cy0 * c + cy0 * cy0 * vm, s0 = Math.Sqrt(s02);
        double u0 = (_k[0] - cx0 * mt - cy0 * mm) / s0;
        if (_k.Length == 1)
        {
            double lam = NormalMath.LogPhiDerivative(u0);
            dmt = -lam * cx0 / s0;
            dmm = -lam * cy0 / s0;
            double ds = -0.5 * lam * u0 / s02; // ∂/∂(s²)
            dvt = ds * cx0 * cx0;
            dvm = ds * cy0 * cy0;
            dc = ds * 2 * cx0 * cy0;
            return NormalMath.LogPhi(u0);
        }
        double cx1 = _cx[1], cy1 = _cy[1];
        double s12 = cx1 * cx1 * vt + 2 * cx1 * cy1 * c + cy1 * cy1 * vm, s1 = Math.Sqrt(s12);
        double u1 = (_k[1] - cx1 * mt - cy1 * mm) / s1;
        double nxy = cx0 * cx1 * vt + (cx0 * cy1 + cy0 * cx1) * c + cy0 * cy1 * vm;
        double rho = nxy / (s0 * s1);
        double value = NormalMath.LogBivariatePhi(u0, u1, rho, out double g0, out double g1, out double gr);
        dmt = -g0 * cx0 / s0 - g1 * cx1 / s1;
        dmm = -g0 * cy0 / s0 - g1 * cy1 / s1;
        double a0 = -0.5 * g0 * u0 / s02, a1 = -0.5 * g1 * u1 / s12; // ∂/∂s₀², ∂/∂s₁² through u
        double inv01 = 1 / (s0 * s1);
        // ∂/∂Σ_x = a0 ∂s₀² + a1 ∂s₁² + gr [∂N inv01 − (ρ/2)(∂s₀²/s₀² + ∂s₁²/s₁²)]
        double Part(double ds0, double ds1, double dn) => a0 * ds0 + a1 * ds1 + gr * (dn * inv01 - 0.5 * rho * (ds0 / s02 + ds1 / s12));
        dvt = Part(cx0 * cx0, cx1 * cx1, cx0 * cx1);
        dvm = Part(cy0 * cy0, cy1 * cy1, cy0 * cy1);
        dc = Part(2 * cx0 * cy0, 2 * cx1 * cy1, cx0 * cy1 + cy0 * cx1);
        return value;
    }
}

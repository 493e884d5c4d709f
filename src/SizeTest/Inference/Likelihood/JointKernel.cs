using SizeTest.Photometry;

namespace SizeTest.Inference.Likelihood;

/// <summary>
/// Joint (ln θ_i, μ_i) bivariate Gaussian with means m_t (as <see cref="SizeKernel"/>) and
/// m_μ = μ0 + 2.5(n − b) log10(1+z) + K + A + κ(ln R0 + a ln(1+z) − ln R_pivot), covariance
/// [[σ_t,i² + σ², κσ²], [κσ², σ_μ,i² + s_μ² + κ²σ²]] (κ = kormendy_slope/ln10: the size–SB relation at matched physical size),
/// truncated by up to two cuts (<see cref="SelectionTruncation"/>). With an <see cref="IsophotalCorrection"/>, m_t gains
/// ln(r_iso/R_e)(m_μ) and ∂/∂m_μ picks up d_t · d ln(r_iso/R_e)/dm_μ.
/// </summary>
/// <remarks>Gradient of −½[rᵀΣ⁻¹r + ln|Σ|]: ∂/∂m = Σ⁻¹r = α, ∂/∂Σ = ½(ααᵀ − Σ⁻¹) (so ∂/∂C = α_tα_μ − (Σ⁻¹)_tμ).</remarks>
internal sealed class JointKernel(ObjectColumns cols, DistanceTerms distances, SelectionTruncation? cut, IsophotalCorrection? isophotal) : IObservableKernel
{
    public double Sum(LikelihoodEvaluation e, in ModelPoint p, int start, int end) => Loop(e, p, start, end, null);

    public double SumWithAdjoint(LikelihoodEvaluation e, in ModelPoint p, int start, int end, ModelAdjoint adjoint) => Loop(e, p, start, end, adjoint);

    private double Loop(LikelihoodEvaluation e, in ModelPoint p, int start, int end, ModelAdjoint? adj)
    {
        double acc = 0, sel = 0;
        double sig2 = p.Sigma2, kap = p.Kappa, c = p.CovInt;
        var nodeA = adj?.NodeAdjoint;
        for (int i = start; i < end; i++)
        {
            double x = cols.Ln1pZ[i], log10OnePlusZ = cols.Log10OnePlusZ[i];
            double lnSizeMean = p.LnR0 + p.A * x;
            double mt = p.C0 + p.A * x - distances.LnDa(e, i, cols.LnZ);
            double mm = p.Mu0 + p.TolmanSlope * log10OnePlusZ + cols.Correction[i] + kap * (lnSizeMean - p.LnPivot);
            double isoSlope = 0;
            if (isophotal is not null)
            {
                if (!isophotal.TryOffset(mm, i, out double lnRatio, out isoSlope)) return double.NegativeInfinity;
                mt += lnRatio;
            }
            double vt = cols.VarLnTheta[i] + sig2, vm = cols.VarMu[i] + p.VarMuInt;
            double det = vt * vm - c * c, idet = 1 / det;
            double rt = cols.LnTheta[i] - mt, rm = cols.Mu[i] - mm;
            acc += (vm * rt * rt - 2 * c * rt * rm + vt * rm * rm) * idet + Math.Log(det);
            if (adj is null)
            {
                if (cut is not null) sel += cut.LogPass(mt, mm, vt, vm, c);
                continue;
            }
            double at = (vm * rt - c * rm) * idet, am = (vt * rm - c * rt) * idet;
            double dt = at, dm = am;
            double dvt = 0.5 * (at * at - vm * idet), dvm = 0.5 * (am * am - vt * idet), dc = at * am + c * idet;
            if (cut is not null)
            {
                sel += cut.LogPass(mt, mm, vt, vm, c, out double smt, out double smm, out double svt, out double svm, out double sc);
                dt -= smt; dm -= smm; dvt -= svt; dvm -= svm; dc -= sc;
            }
            dm += dt * isoSlope; // m_t depends on m_μ through ln(r_iso/R_e)
            adj.AddObject(dt, dm, dvt, dvm, dc, x, log10OnePlusZ);
            distances.Scatter(nodeA, i, dt);
        }
        return -0.5 * acc - sel - 2 * GaussianCore.HalfLn2Pi * (end - start);
    }
}

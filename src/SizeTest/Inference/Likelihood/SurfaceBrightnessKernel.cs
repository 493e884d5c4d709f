namespace SizeTest.Inference.Likelihood;

/// <summary>
/// Surface brightness (Tolman 1930): μ_i ~ N(m_μ,i, V_μ,i), m_μ = μ0 + 2.5(n − b) log10(1+z_i) + K_i + A_i with n the world model's
/// bolometric dimming exponent (plus the flux-convention offset), V_μ = σ_μ,i² + s_μ², optionally truncated by an SB limit.
/// </summary>
internal sealed class SurfaceBrightnessKernel(ObjectColumns cols, SelectionTruncation? cut) : IObservableKernel
{
    public double Sum(LikelihoodEvaluation e, in ModelPoint p, int start, int end)
    {
        int len = end - start;
        double sm2 = p.ScatterMag * p.ScatterMag;
        if (cut is null)
            return -0.5 * GaussianCore.Sum(cols.Mu.AsSpan(start, len), cols.Log10OnePlusZ.AsSpan(start, len), cols.NegCorrection.AsSpan(start, len),
                cols.VarMu.AsSpan(start, len), p.Mu0, p.TolmanSlope, sm2, cols.UniformVarMu) - GaussianCore.HalfLn2Pi * len;
        double acc = 0, sel = 0;
        for (int i = start; i < end; i++)
        {
            double m = p.Mu0 + p.TolmanSlope * cols.Log10OnePlusZ[i] + cols.Correction[i];
            double r = cols.Mu[i] - m, v = cols.VarMu[i] + sm2;
            acc += r * r / v + Math.Log(v);
            sel += cut.LogPass(0, m, 0, v, 0);
        }
        return -0.5 * acc - sel - GaussianCore.HalfLn2Pi * len;
    }

    public double SumWithAdjoint(LikelihoodEvaluation e, in ModelPoint p, int start, int end, ModelAdjoint adj)
    {
        int len = end - start;
        double sm2 = p.ScatterMag * p.ScatterMag;
        if (cut is null)
        {
            var d = new double[len];
            double q = GaussianCore.SumWithPartials(cols.Mu.AsSpan(start, len), cols.Log10OnePlusZ.AsSpan(start, len), cols.NegCorrection.AsSpan(start, len),
                cols.VarMu.AsSpan(start, len), p.Mu0, p.TolmanSlope, sm2, cols.UniformVarMu, d, out double sd, out double sdl, out double sv);
            adj.Dm += sd; adj.DmL10 += sdl; adj.DmX += sdl * ModelPoint.Ln10; adj.DVm += sv;
            return -0.5 * q - GaussianCore.HalfLn2Pi * len;
        }
        double acc = 0, sel = 0;
        for (int i = start; i < end; i++)
        {
            double log10OnePlusZ = cols.Log10OnePlusZ[i];
            double m = p.Mu0 + p.TolmanSlope * log10OnePlusZ + cols.Correction[i];
            double r = cols.Mu[i] - m, v = cols.VarMu[i] + sm2, inv = 1 / v;
            acc += r * r * inv + Math.Log(v);
            sel += cut.LogPass(0, m, 0, v, 0, out _, out double smm, out _, out double svm, out _);
            adj.AddObject(0, r * inv - smm, 0, 0.5 * (r * r * inv * inv - inv) - svm, 0, cols.Ln1pZ[i], log10OnePlusZ);
        }
        return -0.5 * acc - sel - GaussianCore.HalfLn2Pi * len;
    }
}

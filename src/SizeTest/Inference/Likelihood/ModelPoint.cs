namespace SizeTest.Inference.Likelihood;

/// <summary>
/// The scalar model constants of one evaluation, read once from the parameter values: ln R0 and the angular
/// offset c0 = ln R0 + ln(10⁻³) (θ = 10⁻³ R[kpc]/D_A[Mpc]), a, σ² = (ln10·scatter_dex)², μ0, the Tolman slope
/// 2.5(n − b), s_μ², κ = kormendy_slope/ln10 and the derived intrinsic covariance terms of the joint model.
/// Absent parameters read as 0 (R0 as 1).
/// </summary>
internal readonly struct ModelPoint
{
    public const double Ln10 = 2.302585092994046;
    public static readonly double LnKpcPerMpc = Math.Log(1e-3);

    public ModelPoint(ParameterLayout layout, double[] values, double dimming, double lnPivot)
    {
        R0 = layout.R0 >= 0 ? values[layout.R0] : 1;
        LnR0 = Math.Log(R0);
        C0 = LnR0 + LnKpcPerMpc;
        A = layout.SizeEvolution >= 0 ? values[layout.SizeEvolution] : 0;
        double sig = layout.ScatterDex >= 0 ? Ln10 * values[layout.ScatterDex] : 0;
        Sigma2 = sig * sig;
        Mu0 = layout.Mu0 >= 0 ? values[layout.Mu0] : 0;
        double b = layout.SbEvolution >= 0 ? values[layout.SbEvolution] : 0;
        TolmanSlope = 2.5 * (dimming - b);
        ScatterMag = layout.ScatterMag >= 0 ? values[layout.ScatterMag] : 0;
        Kappa = layout.KormendySlope >= 0 ? values[layout.KormendySlope] / Ln10 : 0;
        LnPivot = lnPivot;
        CovInt = Kappa * Sigma2;
        VarMuInt = ScatterMag * ScatterMag + Kappa * Kappa * Sigma2;
    }

    public double R0 { get; }
    public double LnR0 { get; }
    public double C0 { get; }
    public double A { get; }
    public double Sigma2 { get; }
    public double Mu0 { get; }
    public double TolmanSlope { get; }
    public double ScatterMag { get; }
    public double Kappa { get; }
    public double LnPivot { get; }
    public double CovInt { get; }
    public double VarMuInt { get; }
}

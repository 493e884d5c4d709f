using SizeTest.Inference;
namespace SizeTest.Inference.Likelihood;

/// <summary>
/// Where each parameter of a <see cref="Hypothesis"/> sits: its index in the full value vector
/// (<see cref="Hypothesis.Parameters"/> order) and, when free, in θ. The nuisance parameters are found by name
/// (<see cref="NuisanceParameters"/>); everything else is cosmological and acts through the world model
/// (<see cref="DistanceTerms"/>). A parameter that is not part of the hypothesis has index −1.
/// </summary>
internal sealed class ParameterLayout
{
    private readonly int[] _freeOfFull;

    public ParameterLayout(Hypothesis hypothesis)
    {
        var ps = hypothesis.Parameters;
        _freeOfFull = new int[ps.Count];
        var cosmo = new List<int>();
        int j = 0;
        for (int i = 0; i < ps.Count; i++)
        {
            _freeOfFull[i] = ps[i].IsFree ? j++ : -1;
            switch (ps[i].Name)
            {
                case NuisanceParameters.Names.R0Kpc: R0 = i; break;
                case NuisanceParameters.Names.SizeEvolution: SizeEvolution = i; break;
                case NuisanceParameters.Names.ScatterDex: ScatterDex = i; break;
                case NuisanceParameters.Names.Mu0: Mu0 = i; break;
                case NuisanceParameters.Names.SbEvolution: SbEvolution = i; break;
                case NuisanceParameters.Names.ScatterMag: ScatterMag = i; break;
                case NuisanceParameters.Names.KormendySlope: KormendySlope = i; break;
                default: if (!NuisanceParameters.IsSurveyName(ps[i].Name)) cosmo.Add(i); break; // survey names: Survey.SurveySizeLikelihood
            }
        }
        Cosmological = cosmo.ToArray();
        FreeCosmological = cosmo.Where(i => ps[i].IsFree).ToArray();
        FreeCount = j;
    }

    /// <summary>Full indices of the nuisance parameters (−1 when absent).</summary>
    public int R0 { get; } = -1;
    public int SizeEvolution { get; } = -1;
    public int ScatterDex { get; } = -1;
    public int Mu0 { get; } = -1;
    public int SbEvolution { get; } = -1;
    public int ScatterMag { get; } = -1;
    public int KormendySlope { get; } = -1;

    /// <summary>Full indices of the world-model parameters, and of the free ones among them.</summary>
    public int[] Cosmological { get; }
    public int[] FreeCosmological { get; }

    /// <summary>Length of θ.</summary>
    public int FreeCount { get; }

    /// <summary>θ index of full parameter <paramref name="full"/>, or −1 when it is fixed or absent.</summary>
    public int FreeIndex(int full) => full < 0 ? -1 : _freeOfFull[full];

    /// <summary>
    /// The chain rule from the model-quantity partial sums of <paramref name="adjoint"/> to ∂ln L/∂θ (written, not
    /// added, into <paramref name="gradient"/>). With m_t = ln R0 + ln(10⁻³) + a ln(1+z) − ln D_A(z) (+ offsets),
    /// m_μ = μ0 + 2.5(n − b) log10(1+z) + K + A + κ(ln R0 + a ln(1+z) − ln R_pivot), V_t = σ_t² + σ², V_μ = σ_μ² + s_μ² + κ²σ²,
    /// C = κσ² (σ = ln10·scatter_dex, κ = kormendy_slope/ln10):
    /// ∂/∂R0 = (Σd_t + κΣd_μ)/R0; ∂/∂a = Σd_t x + κΣd_μ x; ∂/∂scatter_dex = 2σ ln10 (ΣD_Vt + κ²ΣD_Vμ + κΣD_C);
    /// ∂/∂μ0 = Σd_μ; ∂/∂b = −2.5Σd_μ ℓ; ∂/∂scatter_mag = 2 s_μ ΣD_Vμ;
    /// ∂/∂kormendy_slope = [Σd_μ(ln R0 − ln R_pivot) + aΣd_μ x + 2κσ²ΣD_Vμ + σ²ΣD_C]/ln10;
    /// each free cosmological parameter c: −Σ_k A_k ∂g_k/∂θ_c + 2.5 Σd_μ ℓ · ∂n/∂θ_c
    /// (x = ln(1+z), ℓ = log10(1+z), g_k = ln D_A − ln z at grid node k, A_k = Σ_i d_t,i w_ik the node adjoint).
    /// </summary>
    public void Chain(ModelAdjoint adjoint, ModelPoint p, LikelihoodEvaluation e, Span<double> gradient)
    {
        gradient.Clear();
        double kap = p.Kappa, sig2 = p.Sigma2, sig = Math.Sqrt(sig2);
        Set(gradient, R0, (adjoint.Dt + kap * adjoint.Dm) / p.R0);
        Set(gradient, SizeEvolution, adjoint.DtX + kap * adjoint.DmX);
        Set(gradient, ScatterDex, 2 * sig * ModelPoint.Ln10 * (adjoint.DVt + kap * kap * adjoint.DVm + kap * adjoint.DC));
        Set(gradient, Mu0, adjoint.Dm);
        Set(gradient, SbEvolution, -2.5 * adjoint.DmL10);
        Set(gradient, ScatterMag, 2 * p.ScatterMag * adjoint.DVm);
        Set(gradient, KormendySlope, (adjoint.Dm * (p.LnR0 - p.LnPivot) + p.A * adjoint.DmX + 2 * kap * sig2 * adjoint.DVm + sig2 * adjoint.DC) / ModelPoint.Ln10);
        ChainCosmology(adjoint, e, gradient);
        // Partials a kernel computed directly in θ (the survey terms' own parameters) are added last.
        if (adjoint.Direct is { } direct)
            for (int j = 0; j < direct.Length; j++) gradient[j] += direct[j];
    }

    private void ChainCosmology(ModelAdjoint adjoint, LikelihoodEvaluation e, Span<double> gradient)
    {
        for (int c = 0; c < FreeCosmological.Length; c++)
        {
            int j = _freeOfFull[FreeCosmological[c]];
            double v = 0;
            if (e.GridLnDaOverZDerivatives is { } dg && adjoint.NodeAdjoint is { } nodeA)
            {
                var row = dg[c];
                for (int k = 0; k < row.Length; k++) v -= nodeA[k] * row[k];
            }
            if (e.DimmingDerivatives is { } dn) v += 2.5 * adjoint.DmL10 * dn[c];
            gradient[j] = v;
        }
    }

    private void Set(Span<double> gradient, int full, double value)
    {
        int j = FreeIndex(full);
        if (j >= 0) gradient[j] = value;
    }
}

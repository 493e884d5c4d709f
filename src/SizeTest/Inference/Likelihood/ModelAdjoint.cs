namespace SizeTest.Inference.Likelihood;

/// <summary>
/// Partial sums of ∂ℓ_i/∂(model quantity) over a row slice — the "adjoint" of the per-object model quantities
/// m_t (mean ln θ), m_μ (mean μ), V_t, V_μ (variances) and C (their covariance), weighted by the per-object
/// factors the parameters enter with (x = ln(1+z), ℓ = log10(1+z), and the grid stencil weights w_ik).
/// A kernel fills it per object; <see cref="ParameterLayout.Chain"/> maps it to ∂ln L/∂θ. Slices add
/// (<see cref="Add"/>), so ranks/threads can combine them before or after the chain rule.
/// </summary>
internal sealed class ModelAdjoint
{
    public ModelAdjoint(int gridNodes) { NodeAdjoint = gridNodes > 0 ? new double[gridNodes] : null; }

    /// <summary>Σ d_t, Σ d_t x, Σ d_μ, Σ d_μ x, Σ d_μ ℓ (d = ∂ℓ_i/∂m).</summary>
    public double Dt, DtX, Dm, DmX, DmL10;

    /// <summary>Σ ∂ℓ_i/∂V_t, Σ ∂ℓ_i/∂V_μ, Σ ∂ℓ_i/∂C.</summary>
    public double DVt, DVm, DC;

    /// <summary>A_k = Σ_i d_t,i w_ik: ∂ln L/∂(ln D_A at node k) is −A_k (null when distances are exact per object).</summary>
    public double[]? NodeAdjoint;

    /// <summary>∂ln L/∂θ_j accumulated directly by a kernel for parameters outside the model quantities above (the survey
    /// terms' per-group and per-bin parameters); added by <see cref="ParameterLayout.Chain"/>. Null when unused.</summary>
    public double[]? Direct;

    /// <summary>Adds one object's partials.</summary>
    public void AddObject(double dt, double dm, double dvt, double dvm, double dc, double x, double log10OnePlusZ)
    {
        Dt += dt; DtX += dt * x;
        Dm += dm; DmX += dm * x; DmL10 += dm * log10OnePlusZ;
        DVt += dvt; DVm += dvm; DC += dc;
    }

    /// <summary>Adds another slice's sums.</summary>
    public void Add(ModelAdjoint o)
    {
        Dt += o.Dt; DtX += o.DtX; Dm += o.Dm; DmX += o.DmX; DmL10 += o.DmL10;
        DVt += o.DVt; DVm += o.DVm; DC += o.DC;
        if (NodeAdjoint is not null && o.NodeAdjoint is not null)
            for (int k = 0; k < NodeAdjoint.Length; k++) NodeAdjoint[k] += o.NodeAdjoint[k];
        if (o.Direct is not null)
        {
            Direct ??= new double[o.Direct.Length];
            for (int j = 0; j < Direct.Length; j++) Direct[j] += o.Direct[j];
        }
    }
}

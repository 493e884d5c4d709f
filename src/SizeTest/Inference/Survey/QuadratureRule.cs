namespace SizeTest.Inference.Survey;

/// <summary>An m-point Gaussian quadrature rule: ∫ f(x) W(x) dx ≈ Σ w_j f(x_j) for the rule's weight function W and interval.</summary>
public abstract class QuadratureRule
{
    /// <summary>Nodes x_j, ascending.</summary>
    public double[] Nodes { get; }

    /// <summary>Weights w_j.</summary>
    public double[] Weights { get; }

    /// <summary>Checks the order (1 ≤ m ≤ 100) and takes the nodes and weights from <paramref name="build"/>.</summary>
    protected QuadratureRule(int m, string name, Func<int, (double[] Nodes, double[] Weights)> build)
    {
        if (m is < 1 or > 100) throw new ArgumentOutOfRangeException(nameof(m), m, $"{name} order must be 1–100");
        ArgumentNullException.ThrowIfNull(build);
        (Nodes, Weights) = build(m);
    }
}

namespace SizeTest.Inference;

/// <summary>Why a bounded quasi-Newton run stopped.</summary>
public enum OptimizerExit
{
    /// <summary>The quasi-Newton decrement of the projected gradient fell below the tolerance (a stationary point on the box).</summary>
    Converged,
    /// <summary>The objective stopped changing (relative change below 1e-14 over three iterations) before the decrement test was met.</summary>
    NoFurtherProgress,
    /// <summary>The iteration cap was reached.</summary>
    IterationLimit,
    /// <summary>No step along the projected search direction decreased the objective, even after resetting the curvature memory.</summary>
    LineSearchFailed,
    /// <summary>The objective is not finite at the starting point.</summary>
    NotFinite,
}

namespace SizeTest.Inference;

/// <summary>How a parameter enters a fit.</summary>
public enum ParameterStatus
{
    /// <summary>Free within its bounds (flat prior on the bounded range).</summary>
    Free,
    /// <summary>Held at a given value; does not count in k.</summary>
    Fixed,
    /// <summary>Free within its bounds with a Gaussian prior (a penalty term in maximum likelihood); counts in k.</summary>
    GaussianPrior,
}

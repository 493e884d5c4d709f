namespace SizeTest.Inference;

/// <summary>Which observable a hypothesis is fitted to.</summary>
public enum ObservableKind
{
    /// <summary>Angular size: ln θ against redshift.</summary>
    Size,
    /// <summary>Surface brightness (Tolman test): μ against redshift.</summary>
    SurfaceBrightness,
    /// <summary>Both, as a bivariate Gaussian per object (optionally linked by a size–SB relation).</summary>
    Joint,
}

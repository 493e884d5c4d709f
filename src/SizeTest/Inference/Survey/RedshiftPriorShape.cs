namespace SizeTest.Inference.Survey;

/// <summary>The shape of the redshift prior π(z) of the photometric-redshift marginalisation, on its range [z_lo, z_hi].</summary>
public enum RedshiftPriorShape
{
    /// <summary>The sample's own redshift distribution, deconvolved from the quoted z errors (<see cref="PopulationRedshiftPrior"/>).</summary>
    Population,
    /// <summary>Flat in z.</summary>
    Flat,
}

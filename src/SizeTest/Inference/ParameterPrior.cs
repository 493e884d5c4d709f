namespace SizeTest.Inference;

/// <summary>
/// Prior of one free parameter. Every prior is proper and bounded (nested sampling needs a
/// map from the unit interval), so a Gaussian prior is truncated to the parameter's bounds.
/// </summary>
public abstract record ParameterPrior
{
    /// <summary>Smallest allowed value.</summary>
    public abstract double Min { get; }

    /// <summary>Largest allowed value.</summary>
    public abstract double Max { get; }

    /// <summary>Normalised log prior density at <paramref name="x"/>; −∞ outside [Min, Max].</summary>
    public abstract double LogDensity(double x);

    /// <summary>Inverse CDF: maps u ∈ (0,1) to a value distributed as the prior.</summary>
    public abstract double FromUnit(double u);

    /// <summary>d ln p(x)/dx inside [Min, Max] (0 outside).</summary>
    public abstract double LogDensityDerivative(double x);
}

/// <summary>Uniform prior on [Min, Max].</summary>
public sealed record UniformPrior(double Lower, double Upper) : ParameterPrior
{
    /// <inheritdoc/>
    public override double Min => Lower;
    /// <inheritdoc/>
    public override double Max => Upper;
    /// <inheritdoc/>
    public override double LogDensity(double x) => x >= Lower && x <= Upper ? -Math.Log(Upper - Lower) : double.NegativeInfinity;
    /// <inheritdoc/>
    public override double FromUnit(double u) => Lower + u * (Upper - Lower);
    /// <inheritdoc/>
    public override double LogDensityDerivative(double x) => 0;
}

/// <summary>Gaussian prior N(Mean, Sd²) truncated to [Lower, Upper] and renormalised.</summary>
public sealed record GaussianPrior(double Mean, double Sd, double Lower, double Upper) : ParameterPrior
{
    private double CdfLo => MathNet.Numerics.Distributions.Normal.CDF(Mean, Sd, Lower);
    private double CdfHi => MathNet.Numerics.Distributions.Normal.CDF(Mean, Sd, Upper);

    /// <inheritdoc/>
    public override double Min => Lower;
    /// <inheritdoc/>
    public override double Max => Upper;
    /// <inheritdoc/>
    public override double LogDensity(double x) =>
        x >= Lower && x <= Upper
            ? MathNet.Numerics.Distributions.Normal.PDFLn(Mean, Sd, x) - Math.Log(CdfHi - CdfLo)
            : double.NegativeInfinity;
    /// <inheritdoc/>
    public override double FromUnit(double u) =>
        Math.Clamp(MathNet.Numerics.Distributions.Normal.InvCDF(Mean, Sd, CdfLo + u * (CdfHi - CdfLo)), Lower, Upper);
    /// <inheritdoc/>
    public override double LogDensityDerivative(double x) => x >= Lower && x <= Upper ? -(x - Mean) / (Sd * Sd) : 0;
}

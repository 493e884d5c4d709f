using SizeTest.Cosmology;

namespace SizeTest.Inference;

/// <summary>
/// One parameter of a hypothesis with its status: free within <see cref="Min"/>..<see cref="Max"/>,
/// fixed at <see cref="Value"/>, or free with a Gaussian prior N(<see cref="PriorMean"/>, <see cref="PriorSd"/>²)
/// truncated to the bounds.
/// </summary>
/// <param name="Spec">Declaration (name, unit, default, allowed range).</param>
/// <param name="Status">Free, fixed or Gaussian prior.</param>
/// <param name="Value">Fixed value, or the starting value of a free parameter. NaN for a fixed parameter whose spec default
/// is NaN means "not given": it is left out when the world model is built (e.g. omega_lambda → flat).</param>
/// <param name="Min">Lower bound for a free parameter (within the spec's range).</param>
/// <param name="Max">Upper bound for a free parameter (within the spec's range).</param>
/// <param name="PriorMean">Gaussian prior mean (only for <see cref="ParameterStatus.GaussianPrior"/>).</param>
/// <param name="PriorSd">Gaussian prior standard deviation (only for <see cref="ParameterStatus.GaussianPrior"/>).</param>
public sealed record ParameterSetting(
    ParameterSpec Spec, ParameterStatus Status, double Value, double Min, double Max,
    double PriorMean = double.NaN, double PriorSd = double.NaN)
{
    /// <summary>Machine name of the parameter.</summary>
    public string Name => Spec.Name;

    /// <summary>True unless fixed.</summary>
    public bool IsFree => Status != ParameterStatus.Fixed;

    /// <summary>A free parameter with the spec's default as start and the given (or the spec's) bounds.</summary>
    public static ParameterSetting Free(ParameterSpec spec, double? min = null, double? max = null) =>
        new(spec, ParameterStatus.Free, spec.Default, min ?? spec.Min, max ?? spec.Max);

    /// <summary>A parameter held at <paramref name="value"/> (the spec's default when null).</summary>
    public static ParameterSetting Fixed(ParameterSpec spec, double? value = null) =>
        new(spec, ParameterStatus.Fixed, value ?? spec.Default, spec.Min, spec.Max);

    /// <summary>A free parameter with a Gaussian prior, truncated to the spec's bounds.</summary>
    public static ParameterSetting WithGaussianPrior(ParameterSpec spec, double mean, double sd) =>
        new(spec, ParameterStatus.GaussianPrior, Math.Clamp(mean, spec.Min, spec.Max), spec.Min, spec.Max, mean, sd);

    /// <summary>
    /// The prior of a free parameter: uniform on [Min, Max], or the truncated Gaussian.
    /// Throws for a fixed parameter.
    /// </summary>
    public ParameterPrior Prior => Status switch
    {
        ParameterStatus.Free => new UniformPrior(Min, Max),
        ParameterStatus.GaussianPrior => new GaussianPrior(PriorMean, PriorSd, Min, Max),
        _ => throw new InvalidOperationException($"parameter '{Name}' is fixed and has no prior"),
    };

    /// <summary>Checks the setting; throws <see cref="ArgumentException"/> with a user-facing message.</summary>
    public void Validate()
    {
        if (Status == ParameterStatus.Fixed)
        {
            // A NaN default means "not given" (e.g. omega_lambda: flat); the world model decides.
            if (double.IsNaN(Value) && double.IsNaN(Spec.Default)) return;
            if (!Spec.Allows(Value))
                throw new ArgumentException($"parameter '{Name}' fixed at {Value} is outside its allowed range [{Spec.Min}, {Spec.Max}]");
            return;
        }
        if (!(Min < Max) || Min < Spec.Min || Max > Spec.Max)
            throw new ArgumentException($"parameter '{Name}' bounds [{Min}, {Max}] must be increasing and inside [{Spec.Min}, {Spec.Max}]");
        if (Status == ParameterStatus.GaussianPrior && !(PriorSd > 0 && double.IsFinite(PriorMean)))
            throw new ArgumentException($"parameter '{Name}' Gaussian prior needs a finite mean and a positive standard deviation");
    }
}

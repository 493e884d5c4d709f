namespace SizeTest.Simulation;

/// <summary>
/// A Schechter (1976, ApJ 203, 297) luminosity function in absolute magnitude,
/// φ(M) ∝ 10^{0.4(α+1)(M*−M)} exp(−10^{0.4(M*−M)}), truncated to [<paramref name="BrightLimit"/>, <paramref name="FaintLimit"/>].
/// Drawn by rejection from a uniform proposal in M (the density's maximum over the window bounds it).
/// </summary>
/// <param name="MStar">Characteristic magnitude M* (default −21; common practice for local galaxies, e.g. Blanton et al. 2003 [from memory]).</param>
/// <param name="Alpha">Faint-end slope α (default −1.2).</param>
/// <param name="BrightLimit">Brightest M drawn (default −24).</param>
/// <param name="FaintLimit">Faintest M drawn (default −16).</param>
public sealed record SchechterLuminosityFunction(double MStar = -21.0, double Alpha = -1.2, double BrightLimit = -24.0, double FaintLimit = -16.0)
{
    /// <summary>The unnormalised density at M.</summary>
    public double Density(double m)
    {
        double x = Math.Pow(10, 0.4 * (MStar - m));
        return Math.Pow(x, Alpha + 1) * Math.Exp(-x);
    }

    /// <summary>Checks the values; throws <see cref="ArgumentException"/> with a user-facing message.</summary>
    public void Validate()
    {
        if (!double.IsFinite(MStar) || !double.IsFinite(Alpha)) throw new ArgumentException("the luminosity function's M* and alpha must be finite");
        if (!(BrightLimit < FaintLimit)) throw new ArgumentException("the luminosity function's bright limit must be brighter (more negative) than its faint limit");
    }

    private double? _max;

    /// <summary>Draws one absolute magnitude.</summary>
    public double Sample(ref SimulationRandom rng)
    {
        double max = _max ??= MaxDensity();
        while (true)
        {
            double m = BrightLimit + (FaintLimit - BrightLimit) * rng.NextDouble();
            if (rng.NextDouble() * max <= Density(m)) return m;
        }
    }

    private double MaxDensity()
    {
        // The density in M peaks where x = 10^{0.4(M*−M)} = α + 1 (for α > −1); otherwise it rises to the faint limit.
        double best = Math.Max(Density(BrightLimit), Density(FaintLimit));
        if (Alpha > -1)
        {
            double mPeak = MStar - 2.5 * Math.Log10(Alpha + 1);
            if (mPeak > BrightLimit && mPeak < FaintLimit) best = Math.Max(best, Density(mPeak));
        }
        return best * 1.0000001;
    }
}

namespace SizeTest.Inference;

/// <summary>
/// How people read a fitted parameter: its symbol, the factor from the stored value and the unit. Stored values (results.json,
/// CSV tables) stay in the parameter's own unit; only displays for people use this. For compact radio sources the size scale
/// r0_kpc is the characteristic linear size ℓ_m of ℓ = ℓ_m L^β (1+z)^n (Gurvits, Kellermann &amp; Frey 1999), of parsec scale
/// (ℓ_m ≈ 11.03 pc, Cao et al. 2017), so it is shown in pc (× 1000).
/// </summary>
/// <param name="Symbol">What a reader calls it (<c>ℓ_m</c>, or the parameter's own name).</param>
/// <param name="Scale">Displayed value = stored value × Scale.</param>
/// <param name="Unit">The displayed unit ("" when dimensionless).</param>
public sealed record ParameterDisplay(string Symbol, double Scale, string Unit)
{
    /// <summary>The symbol of the compact radio sources' characteristic linear size.</summary>
    public const string LinearSizeSymbol = "ℓ_m";

    /// <summary>pc per kpc (1 kpc = 1000 pc by definition): the factor from the stored r0_kpc to ℓ_m in pc.</summary>
    public const double PcPerKpc = 1000;

    /// <summary>The display of parameter <paramref name="name"/> with stored unit <paramref name="unit"/>; <paramref name="compactRadioSources"/>:
    /// the sample is of compact radio sources (<see cref="FitSettings.CompactRadioSources"/>).</summary>
    public static ParameterDisplay For(string name, string unit, bool compactRadioSources)
    {
        ArgumentNullException.ThrowIfNull(name);
        string baseName = Comparison.EvolutionTestTable.BaseName(name);
        if (compactRadioSources && (baseName == NuisanceParameters.Names.R0Kpc || baseName.StartsWith(NuisanceParameters.Names.R0Kpc + "_bin", StringComparison.Ordinal)))
        {
            string bin = baseName[NuisanceParameters.Names.R0Kpc.Length..].TrimStart('_');
            string group = Comparison.EvolutionTestTable.GroupOf(name) is { } g ? $"[{g}]" : "";
            return new ParameterDisplay($"{LinearSizeSymbol}{(bin.Length > 0 ? "," + bin : "")}{group}", PcPerKpc, "pc");
        }
        return new ParameterDisplay(name, 1, unit ?? "");
    }

    /// <summary>
    /// <paramref name="p"/> in its displayed unit (value, interval and its pieces × <see cref="Scale"/>), named
    /// "ℓ_m (r0_kpc)" (the stored name, with its group or bin suffix, in brackets) when the display converts; otherwise unchanged.
    /// </summary>
    public static ParameterEstimate Shown(ParameterEstimate p, bool compactRadioSources)
    {
        ArgumentNullException.ThrowIfNull(p);
        var d = For(p.Name, p.Unit, compactRadioSources);
        if (!d.Converts) return p;
        return p with
        {
            Name = $"{LinearSizeSymbol} ({p.Name})", Value = p.Value * d.Scale, Lo = p.Lo * d.Scale, Hi = p.Hi * d.Scale, Unit = d.Unit,
            Regions = [.. p.Regions.Select(r => new IntervalPiece(r.Lo * d.Scale, r.Hi * d.Scale))],
        };
    }

    /// <summary>Whether the display differs from the stored value (a symbol, scale or unit of its own).</summary>
    public bool Converts => Scale != 1;
}

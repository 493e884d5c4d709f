namespace SizeTest.Reporting.Figures;

/// <summary>
/// One axis: its quantity name, its unit, whether it is logarithmic, optional fixed limits and
/// optional category labels. Every axis declares a unit; dimensionless quantities say so with
/// <see cref="Dimensionless"/> (the title is then drawn without a unit suffix).
/// </summary>
/// <param name="Label">Quantity, e.g. "angular size θ".</param>
/// <param name="Unit">Unit, e.g. "arcsec", "mag/arcsec²"; <see cref="Dimensionless"/> for pure numbers.</param>
public sealed record AxisSpec(string Label, string Unit)
{
    /// <summary>The unit marker of a dimensionless quantity (redshift, ΔBIC, weights, counts of objects use "objects").</summary>
    public const string Dimensionless = "dimensionless";

    /// <summary>Logarithmic axis: data are drawn at log10 of their values, decades labelled 10ⁿ.</summary>
    public bool Log { get; init; }

    /// <summary>Lower limit in data units, or null for automatic (data range plus a margin).</summary>
    public double? Min { get; init; }

    /// <summary>Upper limit in data units, or null for automatic.</summary>
    public double? Max { get; init; }

    /// <summary>Values increase downwards/leftwards (magnitudes: brighter up).</summary>
    public bool Inverted { get; init; }

    /// <summary>When set, the axis is categorical: category i sits at coordinate i and is labelled with entry i.</summary>
    public IReadOnlyList<string>? Categories { get; init; }

    /// <summary>Only whole-number ticks (counts).</summary>
    public bool IntegerTicks { get; init; }

    /// <summary>
    /// At most three "nice" ticks, kept away from both ends of the axis (inner 80%), so labels of panels placed side
    /// by side (a corner plot) never collide.
    /// </summary>
    public bool InnerTicks { get; init; }

    /// <summary>The axis title as drawn: "Label (Unit)", or just the label when dimensionless.</summary>
    public string Title => Unit == Dimensionless || Unit.Length == 0 ? Label : $"{Label} ({Unit})";
}

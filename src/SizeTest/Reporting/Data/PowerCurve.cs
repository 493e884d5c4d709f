namespace SizeTest.Reporting.Data;

/// <summary>
/// Power of the comparison from mock catalogues: for each design value (usually the number of
/// objects), the fraction of mocks in which the decision rule picked the true model.
/// </summary>
/// <param name="XLabel">Design quantity (e.g. "objects per catalogue").</param>
/// <param name="XUnit">Its unit ("objects", "dimensionless", …).</param>
/// <param name="Lines">One line per decision rule or true model.</param>
public sealed record PowerCurve(string XLabel, string XUnit, IReadOnlyList<PowerLine> Lines)
{
    /// <summary>Draw x on a log axis.</summary>
    public bool XLog { get; init; } = true;
    /// <summary>Target power drawn as a reference line (a study copies power.json <c>target_power</c>), or null.</summary>
    public double? Target { get; init; } = 0.8;

    /// <summary>ΔBIC the target refers to (a study copies power.json <c>decisive_delta_bic</c>), or null when not stated.</summary>
    public double? DecisionDeltaBic { get; init; }

    /// <summary>The power conclusion for this sample in one sentence ("with N objects the design decides in X% of mocks …"), or "".</summary>
    public string Statement { get; init; } = "";

    /// <summary>What the mock catalogues behind the curve assumed (true model, objects, redshifts, candidates, rule), one line each.</summary>
    public IReadOnlyList<string> Assumptions { get; init; } = [];
}

/// <summary>Power at each design value with a binomial interval.</summary>
/// <param name="Label">Rule in words (e.g. "ΔBIC &gt; 6 for the true model, truth = lcdm").</param>
/// <param name="X">Design values.</param>
/// <param name="Power">Power 0–1.</param>
/// <param name="Lo">Lower end of its 68% interval.</param>
/// <param name="Hi">Upper end.</param>
public sealed record PowerLine(string Label, IReadOnlyList<double> X, IReadOnlyList<double> Power, IReadOnlyList<double> Lo, IReadOnlyList<double> Hi);

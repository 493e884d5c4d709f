using SizeTest.Inference;

namespace SizeTest.Reporting.Data;

/// <summary>
/// One fitted model as the report needs it: the fit summary (the <c>results.json</c> entry),
/// its best-fit curves with and without its evolution terms, and the evolution it requires.
/// </summary>
/// <param name="Fit">Fit summary with parameters and information criteria (ΔAIC, ΔBIC and weights filled in).</param>
public sealed record ModelReport(ModelFitSummary Fit)
{
    /// <summary>Name shown in figures and tables (defaults to the model name).</summary>
    public string DisplayName { get; init; } = "";

    /// <summary>Best-fit angular size θ(z) in arcsec including the fitted size evolution, or null.</summary>
    public Curve? Theta { get; init; }

    /// <summary>The same model with its evolution terms set to zero, or null.</summary>
    public Curve? ThetaNoEvolution { get; init; }

    /// <summary>Best-fit surface brightness μ(z) in mag/arcsec² including luminosity evolution, or null.</summary>
    public Curve? Mu { get; init; }

    /// <summary>The same without evolution, or null.</summary>
    public Curve? MuNoEvolution { get; init; }

    /// <summary>Expected mean μ(z) of the objects that pass the selection cuts (the truncated-Gaussian mean), or null without an SB limit.</summary>
    public Curve? MuSelected { get; init; }

    /// <summary>Evolution the model needs to fit (e.g. the size-evolution exponent with its interval).</summary>
    public IReadOnlyList<EvolutionRequirement> RequiredEvolution { get; init; } = [];

    /// <summary>With binned evolution: per population the fitted R0 of each redshift bin and the power-law fit; empty otherwise.</summary>
    public IReadOnlyList<BinnedSizeEvolution> BinnedEvolution { get; init; } = [];

    /// <summary>With binned evolution of an sb or joint fit: per population the fitted μ0 of each redshift bin and the power-law fit; empty otherwise.</summary>
    public IReadOnlyList<BinnedSurfaceBrightnessEvolution> BinnedSurfaceBrightness { get; init; } = [];

    /// <summary><see cref="DisplayName"/> or the model name.</summary>
    [System.Text.Json.Serialization.JsonIgnore]
    public string Label => DisplayName.Length > 0 ? DisplayName : Cosmology.WorldModelDisplayNames.For(Fit.Name);
}

/// <summary>A curve y(x) sampled at increasing x.</summary>
/// <param name="X">x values (redshift for model curves), increasing.</param>
/// <param name="Y">y values.</param>
public sealed record Curve(IReadOnlyList<double> X, IReadOnlyList<double> Y)
{
    /// <summary>
    /// Samples <paramref name="f"/> at <paramref name="points"/> values from <paramref name="xMin"/>
    /// to <paramref name="xMax"/> (log-spaced when <paramref name="logSpaced"/>, the default for
    /// redshift curves drawn on log axes). Non-finite values are kept out.
    /// </summary>
    public static Curve Sample(Func<double, double> f, double xMin, double xMax, int points = 100, bool logSpaced = true)
    {
        ArgumentNullException.ThrowIfNull(f);
        if (points < 2 || !(xMax > xMin) || (logSpaced && !(xMin > 0)))
            throw new ArgumentException("need at least 2 points on a range with max > min (> 0 when log-spaced)");
        var xs = new List<double>(points); var ys = new List<double>(points);
        for (int i = 0; i < points; i++)
        {
            double t = (double)i / (points - 1);
            double x = logSpaced ? Math.Exp(Math.Log(xMin) + t * (Math.Log(xMax) - Math.Log(xMin))) : xMin + t * (xMax - xMin);
            double y = f(x);
            if (double.IsFinite(y)) { xs.Add(x); ys.Add(y); }
        }
        return new Curve(xs, ys);
    }

    /// <summary>Linear interpolation at <paramref name="x"/> (in log-log when <paramref name="logLog"/>); NaN outside the curve.</summary>
    public double At(double x, bool logLog = false)
    {
        if (X.Count == 0 || x < X[0] || x > X[^1]) return double.NaN;
        int hi = 1;
        while (hi < X.Count - 1 && X[hi] < x) hi++;
        int lo = hi - 1;
        if (logLog && X[lo] > 0 && Y[lo] > 0 && Y[hi] > 0)
        {
            double t = (Math.Log(x) - Math.Log(X[lo])) / (Math.Log(X[hi]) - Math.Log(X[lo]));
            return Math.Exp(Math.Log(Y[lo]) + t * (Math.Log(Y[hi]) - Math.Log(Y[lo])));
        }
        double f = X[hi] == X[lo] ? 0 : (x - X[lo]) / (X[hi] - X[lo]);
        return Y[lo] + f * (Y[hi] - Y[lo]);
    }
}

/// <summary>An evolution term a model needs: e.g. <c>size_evolution</c> a in R ∝ (1+z)^a, with its 68% interval.</summary>
/// <param name="Name">Machine name (e.g. <c>size_evolution</c>, <c>sb_evolution</c>).</param>
/// <param name="Description">In words, with the form (e.g. "size evolution a, R ∝ (1+z)^a").</param>
/// <param name="Value">Best estimate.</param>
/// <param name="Lo">Lower end of the 68% interval.</param>
/// <param name="Hi">Upper end of the 68% interval.</param>
public sealed record EvolutionRequirement(string Name, string Description, double Value, double Lo, double Hi);

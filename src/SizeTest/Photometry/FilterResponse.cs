namespace SizeTest.Photometry;

/// <summary>
/// A filter (band-pass) response curve R(λ), wavelengths in Å, in the <b>photon-counting</b>
/// convention: R(λ) is the probability that a photon of wavelength λ is counted (the usual
/// form of survey filter curves), so a band flux is ∫ f_ν R dν/ν (Hogg et al. 2002,
/// astro-ph/0210394, §2; Fukugita et al. 1996). Interpolated linearly in λ between nodes and
/// zero outside the tabulated range. For an energy-counting curve S(λ) supply S(λ)/λ.
/// </summary>
public sealed class FilterResponse
{
    private readonly double[] _lambda;
    private readonly double[] _response;

    private FilterResponse(string name, double[] lambda, double[] response)
    {
        Name = name;
        _lambda = lambda;
        _response = response;
        // λ_p² = ∫ R λ dλ / ∫ R dλ/λ (pivot wavelength, Tokunaga & Vacca 2005, PASP 117, 421; from memory),
        // integrated exactly for piecewise-linear R by fine Simpson on the nodes.
        double num = LogLambdaIntegrator.Integrate(l => ResponseAt(l) * l * l, _lambda, _lambda[0], _lambda[^1]);
        double den = LogLambdaIntegrator.Integrate(ResponseAt, _lambda, _lambda[0], _lambda[^1]);
        if (!(den > 0)) throw new ArgumentException($"{name}: the response is zero everywhere.");
        PivotWavelengthAngstrom = Math.Sqrt(num / den);
    }

    /// <summary>Band name (for messages, descriptions and band look-ups).</summary>
    public string Name { get; }

    /// <summary>Tabulated wavelengths, Å.</summary>
    public IReadOnlyList<double> LambdaAngstrom => _lambda;

    /// <summary>Shortest tabulated wavelength, Å.</summary>
    public double MinLambdaAngstrom => _lambda[0];

    /// <summary>Longest tabulated wavelength, Å.</summary>
    public double MaxLambdaAngstrom => _lambda[^1];

    /// <summary>Pivot wavelength λ_p = [∫R λ dλ / ∫R dλ/λ]^{1/2} in Å (photon-counting R), used as the band's effective wavelength.</summary>
    public double PivotWavelengthAngstrom { get; }

    /// <summary>Builds a filter from columns already read: λ in Å strictly increasing, response ≥ 0, not all zero.</summary>
    /// <exception cref="ArgumentException">Columns violate the rules (message names the row).</exception>
    public static FilterResponse FromColumns(double[] lambdaAngstrom, double[] response, string name = "filter")
    {
        ArgumentNullException.ThrowIfNull(lambdaAngstrom);
        ArgumentNullException.ThrowIfNull(response);
        TableChecks.CheckGrid(lambdaAngstrom, response, name, "response");
        return new FilterResponse(name, (double[])lambdaAngstrom.Clone(), (double[])response.Clone());
    }

    /// <summary>A top-hat response of 1 between two wavelengths (with steep 0.1 % edges), for tests and quick studies.</summary>
    public static FilterResponse TopHat(double loAngstrom, double hiAngstrom, string name = "top-hat")
    {
        double e = 1e-3 * (hiAngstrom - loAngstrom);
        return FromColumns([loAngstrom - e, loAngstrom, hiAngstrom, hiAngstrom + e], [0, 1, 1, 0], name);
    }

    /// <summary>The same curve with every wavelength multiplied by <paramref name="factor"/> (R'(λ) = R(λ/factor)), e.g. a rest-frame band blue-shifted or red-shifted by (1+z).</summary>
    public FilterResponse Shifted(double factor, string? name = null)
    {
        if (!(factor > 0)) throw new ArgumentOutOfRangeException(nameof(factor), factor, "Shift factor must be > 0.");
        var l = new double[_lambda.Length];
        for (int i = 0; i < l.Length; i++) l[i] = _lambda[i] * factor;
        return new FilterResponse(name ?? Name, l, (double[])_response.Clone());
    }

    /// <summary>R(λ): linear interpolation between nodes, 0 outside.</summary>
    public double ResponseAt(double lambdaAngstrom)
    {
        var l = _lambda;
        if (!(lambdaAngstrom >= l[0]) || lambdaAngstrom > l[^1]) return 0.0;
        int i = Array.BinarySearch(l, lambdaAngstrom);
        if (i >= 0) return _response[i];
        int hi = ~i, lo = hi - 1;
        double t = (lambdaAngstrom - l[lo]) / (l[hi] - l[lo]);
        return _response[lo] + t * (_response[hi] - _response[lo]);
    }
}

using SizeTest.Cosmology;

namespace SizeTest.Tests.Inference;

/// <summary>
/// Small world models local to the inference tests (the real ones live in Cosmology, built elsewhere):
/// Einstein–de Sitter in closed form, a static Euclidean d = cz/H0, and flat ΛCDM by Simpson quadrature.
/// </summary>
internal sealed class TestWorldModel(string name, bool expanding, double h0, double dimming, Func<double, double> da, IReadOnlyDictionary<string, double> values) : IWorldModel
{
    public string Name => name;
    public bool IsExpanding => expanding;
    public double HubbleConstant => h0;
    public double BolometricDimmingExponent => dimming;
    public IReadOnlyDictionary<string, double> ParameterValues => values;
    public bool Defines(DistanceQuantity quantity) => quantity == DistanceQuantity.AngularDiameter;
    public double AngularDiameterDistance(double z) => da(z);
    public double LuminosityDistance(double z) => double.NaN;
    public double ComovingDistance(double z) => double.NaN;
    public double TransverseComovingDistance(double z) => double.NaN;
    public double LookbackTime(double z) => double.NaN;
    public void AngularDiameterDistances(ReadOnlySpan<double> z, Span<double> result)
    {
        for (int i = 0; i < z.Length; i++) result[i] = da(z[i]);
    }
}

internal sealed class TestFamily(string name, bool expanding, IReadOnlyList<ParameterSpec> parameters, Func<IReadOnlyDictionary<string, double>, IWorldModel> create) : IWorldModelFamily
{
    public string Name => name;
    public string Description => name + " (test-local)";
    public bool IsExpanding => expanding;
    public IReadOnlyList<ParameterSpec> Parameters => parameters;
    public IWorldModel Create(IReadOnlyDictionary<string, double> values)
    {
        var all = parameters.ToDictionary(p => p.Name, p => p.Default);
        foreach (var (k, v) in values)
        {
            var spec = parameters.FirstOrDefault(p => p.Name == k) ?? throw new ArgumentException($"unknown parameter {k}");
            if (!spec.Allows(v)) throw new ArgumentException($"{k}={v} out of range");
            all[k] = v;
        }
        return create(all);
    }

    public bool TryCreate(IReadOnlyDictionary<string, double> values, [System.Diagnostics.CodeAnalysis.NotNullWhen(true)] out IWorldModel? model, [System.Diagnostics.CodeAnalysis.NotNullWhen(false)] out string? error)
    {
        try { model = Create(values); error = null; return true; }
        catch (ArgumentException ex) { model = null; error = ex.Message; return false; }
    }

    public string DimmingLaw => expanding ? "(1+z)^-4" : "(1+z)^-n";
}

internal static class TestWorldModels
{
    /// <summary>Speed of light in km/s (exact, SI definition / CODATA 2018).</summary>
    public const double C = 299792.458;

    public static readonly ParameterSpec H0 = new("h0", "H0", "km/s/Mpc", 70, 20, 150, "Hubble constant");
    public static readonly ParameterSpec OmegaM = new("omega_m", "Ωm", "", 0.3, 0.01, 1.5, "matter density");
    public static readonly ParameterSpec Dimming = new("dimming_exponent", "n", "", 1, 0, 6, "static dimming exponent");

    /// <summary>EdS: D_A = 2 D_H [1 − (1+z)^−1/2] / (1+z) (docs/science.md §1.4).</summary>
    public static TestFamily Eds { get; } = new("eds", true, [H0], v =>
    {
        double dh = C / v["h0"];
        return new TestWorldModel("eds", true, v["h0"], 4, z => 2 * dh * (1 - 1 / Math.Sqrt(1 + z)) / (1 + z), v);
    });

    /// <summary>Static Euclidean, d = cz/H0 (docs/science.md §1.5); θ = ℓ/d.</summary>
    public static TestFamily StaticLinear { get; } = new("static-linear", false, [H0, Dimming], v =>
    {
        double dh = C / v["h0"];
        return new TestWorldModel("static-linear", false, v["h0"], v["dimming_exponent"], z => dh * z, v);
    });

    /// <summary>Flat ΛCDM without radiation: D_A = D_H/(1+z) ∫0^z dz'/E, E = √(Ωm(1+z)³ + 1 − Ωm) (Hogg 1999 eqs. 14–18), Simpson with 200 steps.</summary>
    public static TestFamily FlatLcdm { get; } = new("lcdm", true, [H0, OmegaM], v =>
    {
        double dh = C / v["h0"], om = v["omega_m"];
        double Inv(double z) => 1 / Math.Sqrt(om * (1 + z) * (1 + z) * (1 + z) + 1 - om);
        double Da(double z)
        {
            int n = 200;
            double h = z / n, s = Inv(0) + Inv(z);
            for (int i = 1; i < n; i++) s += (i % 2 == 1 ? 4 : 2) * Inv(i * h);
            return dh * s * h / 3 / (1 + z);
        }
        return new TestWorldModel("lcdm", true, v["h0"], 4, Da, v);
    });
}

using SizeTest.Cosmology;

namespace SizeTest.Benchmarks;

/// <summary>
/// Stand-in world models for the likelihood and fit benchmarks until the Cosmology registry is on main:
/// EdS and static models in closed form, flat ΛCDM by cumulative Simpson quadrature over sorted redshifts.
/// </summary>
internal static class LikelihoodBenchWorldModels
{
    private const double C = 299792.458; // km/s, exact (SI)
    private static readonly ParameterSpec H0 = new("h0", "H0", "km/s/Mpc", 70, 10, 300, "Hubble constant");
    private static readonly ParameterSpec Om = new("omega_m", "Ωm", "", 0.3, 0, 5, "matter density");
    private static readonly ParameterSpec Dim = new("dimming_exponent", "n", "", 1, -10, 10, "dimming");

    public static IWorldModelFamily Get(string name) => name switch
    {
        "lcdm" => new Family("lcdm", true, [H0, Om], v => new Model(v, 4, (zs, r) => Lcdm(C / v["h0"], v["omega_m"], zs, r))),
        "eds" => new Family("eds", true, [H0], v => new Model(v, 4, (zs, r) => { double dh = C / v["h0"]; for (int i = 0; i < zs.Length; i++) r[i] = 2 * dh * (1 - 1 / Math.Sqrt(1 + zs[i])) / (1 + zs[i]); })),
        "static-linear" => new Family("static-linear", false, [H0, Dim], v => new Model(v, v["dimming_exponent"], (zs, r) => { double dh = C / v["h0"]; for (int i = 0; i < zs.Length; i++) r[i] = dh * zs[i]; })),
        "tired-light" => new Family("tired-light", false, [H0, Dim], v => new Model(v, v["dimming_exponent"], (zs, r) => { double dh = C / v["h0"]; for (int i = 0; i < zs.Length; i++) r[i] = dh * Math.Log(1 + zs[i]); })),
        _ => throw new ArgumentException(name),
    };

    private static void Lcdm(double dh, double om, ReadOnlySpan<double> z, Span<double> r)
    {
        double Inv(double x) => 1 / Math.Sqrt(om * (1 + x) * (1 + x) * (1 + x) + 1 - om);
        double prev = 0, acc = 0;
        for (int i = 0; i < z.Length; i++)
        {
            double a = prev, b = z[i];
            const int m = 8;
            double h = (b - a) / m, s = Inv(a) + Inv(b);
            for (int k = 1; k < m; k++) s += (k % 2 == 1 ? 4 : 2) * Inv(a + k * h);
            acc += s * h / 3;
            prev = b;
            r[i] = dh * acc / (1 + b);
        }
    }

    private delegate void DaFn(ReadOnlySpan<double> z, Span<double> r);

    private sealed class Model(IReadOnlyDictionary<string, double> v, double n, DaFn da) : IWorldModel
    {
        public string Name => "bench";
        public bool IsExpanding => true;
        public double HubbleConstant => v["h0"];
        public double BolometricDimmingExponent => n;
        public IReadOnlyDictionary<string, double> ParameterValues => v;
        public bool Defines(DistanceQuantity quantity) => quantity == DistanceQuantity.AngularDiameter;
        public double AngularDiameterDistance(double z) { Span<double> r = stackalloc double[1]; da([z], r); return r[0]; }
        public double LuminosityDistance(double z) => double.NaN;
        public double ComovingDistance(double z) => double.NaN;
        public double TransverseComovingDistance(double z) => double.NaN;
        public double LookbackTime(double z) => double.NaN;
        public void AngularDiameterDistances(ReadOnlySpan<double> z, Span<double> result) => da(z, result);
    }

    private sealed class Family(string name, bool expanding, ParameterSpec[] ps, Func<IReadOnlyDictionary<string, double>, IWorldModel> make) : IWorldModelFamily
    {
        public string Name => name;
        public string Description => name;
        public bool IsExpanding => expanding;
        public IReadOnlyList<ParameterSpec> Parameters => ps;
        public IWorldModel Create(IReadOnlyDictionary<string, double> values)
        {
            var all = ps.ToDictionary(p => p.Name, p => p.Default);
            foreach (var (k, x) in values) all[k] = x;
            return make(all);
        }
    }
}

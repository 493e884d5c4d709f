namespace SizeTest.Tests.Cosmology;

/// <summary>Small numerical helpers for the tests.</summary>
internal static class TestMath
{
    /// <summary>Maximum of a unimodal function on [a, b] by golden-section search.</summary>
    public static (double X, double Value) Maximum(Func<double, double> f, double a, double b)
    {
        double g = (Math.Sqrt(5) - 1) / 2;
        double c = b - g * (b - a), d = a + g * (b - a);
        while (b - a > 1e-10)
        {
            if (f(c) > f(d)) b = d; else a = c;
            c = b - g * (b - a);
            d = a + g * (b - a);
        }
        double x = 0.5 * (a + b);
        return (x, f(x));
    }

    /// <summary>Relative difference |a/b − 1|.</summary>
    public static double Relative(double a, double b) => Math.Abs(a / b - 1);
}

using System.Runtime.Intrinsics;
using CsCheck;
using SizeTest.Distributed;
using Xunit;

namespace SizeTest.Tests.Distributed;

public sealed class VectorLogTests
{
    [Fact]
    public void AgreesWithMathLogOverTheNormalRange()
    {
        // Reference: System.Math.Log (correctly rounded to within 1 ulp on .NET). Tolerance: 4 ulp of the result,
        // or 1e-300 absolute near ln 1 = 0 where relative error is undefined.
        Gen.Double[-690, 690].Select(Gen.Double[-690, 690], Gen.Double[-690, 690], Gen.Double[-690, 690]).Sample((a, b, c, d) =>
        {
            double[] x = [Math.Exp(a), Math.Exp(b), Math.Exp(c), Math.Exp(d)];
            var got = VectorLog.Log(Vector256.Create(x[0], x[1], x[2], x[3]));
            for (int i = 0; i < 4; i++)
            {
                double expected = Math.Log(x[i]);
                double tol = 4 * Math.Max(double.Epsilon, Math.BitIncrement(Math.Abs(expected)) - Math.Abs(expected));
                Assert.True(Math.Abs(got.GetElement(i) - expected) <= Math.Max(tol, 1e-300) + 4e-16 * Math.Abs(expected),
                    $"ln({x[i]:R}) = {got.GetElement(i):R}, expected {expected:R}");
            }
        }, iter: 20000, seed: "0tQqWcMv1vY7");
    }

    [Theory]
    [InlineData(1.0)]
    [InlineData(2.0)]
    [InlineData(0.5)]
    [InlineData(1.4142135623730951)]
    [InlineData(1.4142135623730954)]
    [InlineData(2.2250738585072014E-308)]
    [InlineData(1.7976931348623157E308)]
    public void EdgeValues(double x)
    {
        // ln 1 = 0, ln 2, the √2 switch point and the ends of the normal range, against Math.Log (±2 ulp + 1e-300).
        double got = VectorLog.Log(Vector256.Create(x)).GetElement(0);
        Assert.True(Math.Abs(got - Math.Log(x)) <= 5e-16 * Math.Abs(Math.Log(x)) + 1e-300, $"{got:R} vs {Math.Log(x):R}");
    }
}

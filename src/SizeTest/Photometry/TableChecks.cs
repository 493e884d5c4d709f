namespace SizeTest.Photometry;

/// <summary>Shared validation of tabulated curves (wavelength grid plus values).</summary>
internal static class TableChecks
{
    /// <summary>Throws <see cref="ArgumentException"/> unless λ is strictly increasing and positive and values are finite and ≥ 0.</summary>
    public static void CheckGrid(double[] lambda, double[] values, string source, string what)
    {
        if (lambda.Length != values.Length)
            throw new ArgumentException($"{source}: {lambda.Length} wavelengths but {values.Length} {what} values.");
        if (lambda.Length < 2)
            throw new ArgumentException($"{source}: need at least 2 rows, found {lambda.Length}.");
        for (int i = 0; i < lambda.Length; i++)
        {
            if (!(lambda[i] > 0) || double.IsInfinity(lambda[i]))
                throw new ArgumentException($"{source}: row {i + 1}: wavelength must be a finite positive number of Å, got {lambda[i]}.");
            if (i > 0 && !(lambda[i] > lambda[i - 1]))
                throw new ArgumentException($"{source}: row {i + 1}: wavelengths must increase strictly ({lambda[i - 1]} then {lambda[i]}).");
            if (!double.IsFinite(values[i]) || values[i] < 0)
                throw new ArgumentException($"{source}: row {i + 1}: {what} must be finite and ≥ 0, got {values[i]}.");
        }
    }
}

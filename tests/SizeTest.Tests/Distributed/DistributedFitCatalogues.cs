using System.Globalization;
using System.Text;
using SizeTest.Catalogues.Parquet;
using SizeTest.Distributed;

namespace SizeTest.Tests.Distributed;

/// <summary>SYNTHETIC catalogues for the distributed `fit` tests (rows from <see cref="SyntheticKernelRows"/>, EdS truth).</summary>
internal static class DistributedFitCatalogues
{
    private static (double[] Z, double[] Theta, double[] ThetaErr) Rows(int n, ulong seed)
    {
        var z = new double[n]; var y = new double[n]; var e = new double[n];
        SyntheticKernelRows.Fill(seed, 0, z, y, e);
        var th = y.Select(v => Math.Exp(v) * SizeTest.Foundation.Angles.AngleUnits.ArcsecPerRadian).ToArray();
        var te = th.Select((t, i) => t * e[i]).ToArray();
        z[5] = -1; // one bad row: rejected by the loader
        return (z, th, te);
    }

    /// <summary>A CSV catalogue with columns z, theta, theta_err (arcsec); row 6 has z &lt; 0.</summary>
    public static string Csv(string dir, int n, ulong seed = 41)
    {
        var (z, th, te) = Rows(n, seed);
        var sb = new StringBuilder("z,theta,theta_err\n");
        for (int i = 0; i < n; i++)
            sb.Append(string.Create(CultureInfo.InvariantCulture, $"{z[i]:R},{th[i]:R},{te[i]:R}\n"));
        var path = Path.Combine(dir, "mock-synthetic.csv");
        File.WriteAllText(path, sb.ToString());
        return path;
    }

    /// <summary>The same rows as Parquet with row groups of <paramref name="groupRows"/>.</summary>
    public static string Parquet(string dir, int n, int groupRows, ulong seed = 41)
    {
        var (z, th, te) = Rows(n, seed);
        var path = Path.Combine(dir, "mock-synthetic.parquet");
        ParquetTableWriter.Write(path, [ParquetColumnValues.Number("z", z), ParquetColumnValues.Number("theta", th), ParquetColumnValues.Number("theta_err", te)], groupRows);
        return path;
    }
}

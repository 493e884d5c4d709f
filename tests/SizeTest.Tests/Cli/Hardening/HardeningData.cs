using System.Globalization;
using System.Text;
using SizeTest.Tests.Inference;
using SizeTest.Foundation.Angles;

namespace SizeTest.Tests.Cli.Hardening;

/// <summary>Synthetic catalogues (mock EdS draws, invented objects) and byte-exact folder snapshots.</summary>
internal static class HardeningData
{
    public static readonly string[] ColArgs = ["--col", "z=z", "--col", "theta=theta_arcsec:arcsec", "--col", "theta_err=theta_err_arcsec:arcsec", "--col", "mu=mu", "--col", "mu_err=mu_err"];

    /// <summary>Fast fit settings for tests (one model, one start, no cross-validation).</summary>
    public static readonly string[] Quick = ["--models", "eds", "--starts", "1", "--cv-folds", "0"];

    /// <summary>CSV text of <paramref name="n"/> objects drawn from EdS (R0 = 4 kpc, a = −1, 0.2 dex scatter).</summary>
    public static string CatalogueText(int n = 120, int seed = 3)
    {
        var obs = MockCatalogue.Draw(TestWorldModels.Eds.Create(new Dictionary<string, double>()), n, new MockCatalogue.Truth(), seed);
        var sb = new StringBuilder("# synthetic mock catalogue for tests\nid,z,theta_arcsec,theta_err_arcsec,mu,mu_err\n");
        for (int i = 0; i < obs.Count; i++)
        {
            double th = Math.Exp(obs.LnTheta![i]) * AngleUnits.ArcsecPerRadian;
            sb.Append(CultureInfo.InvariantCulture, $"g{i},{obs.Z[i]:R},{th:R},{0.05 * th:R},{obs.Mu![i]:R},0.1\n");
        }
        return sb.ToString();
    }

    /// <summary>Every file below <paramref name="dir"/> (relative path → bytes), hidden files included.</summary>
    public static SortedDictionary<string, byte[]> Snapshot(string dir)
    {
        var d = new SortedDictionary<string, byte[]>(StringComparer.Ordinal);
        foreach (var f in Directory.EnumerateFiles(dir, "*", new EnumerationOptions { RecurseSubdirectories = true, AttributesToSkip = 0 }))
            d[Path.GetRelativePath(dir, f)] = File.ReadAllBytes(f);
        return d;
    }

    /// <summary>Asserts two snapshots are byte-identical (same files, same bytes).</summary>
    public static void AssertSame(SortedDictionary<string, byte[]> before, SortedDictionary<string, byte[]> after)
    {
        Xunit.Assert.Equal(before.Keys, after.Keys);
        foreach (var k in before.Keys) Xunit.Assert.True(before[k].AsSpan().SequenceEqual(after[k]), $"{k} changed");
    }

    /// <summary>Hidden staging or lock entries (<c>.NAME.tmp-…</c>, <c>.NAME.old-…</c>, <c>.NAME.lock</c>) in <paramref name="dir"/>.</summary>
    public static string[] StagingLeft(string dir) =>
        Directory.EnumerateFileSystemEntries(dir, ".*", new EnumerationOptions { AttributesToSkip = 0 })
            .Select(Path.GetFileName).Where(n => n!.Contains(".tmp-") || n.Contains(".old-") || n.EndsWith(".lock")).ToArray()!;
}

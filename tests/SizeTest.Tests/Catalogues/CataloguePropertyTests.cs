using System.Globalization;
using CsCheck;
using SizeTest.Catalogues;
using SizeTest.Catalogues.Text;
using SizeTest.Foundation.Errors;
using Xunit;
using SizeTest.Foundation.Angles;

namespace SizeTest.Tests.Catalogues;

/// <summary>
/// CsCheck property tests. Seeds are fixed (strings from <c>new CsCheck.PCG(20261201, 3)</c> and
/// <c>new CsCheck.PCG(7, 11)</c>) so every run draws the same cases.
/// </summary>
public sealed class CataloguePropertyTests
{
    private const string Seed = "0000002qBaChBid1";
    private const string CorruptionSeed = "0000000000q7";

    private sealed record Row(double Z, double ThetaArcsec, double ThetaErrArcsec, double Mu, double MuErr, string Id);

    private static readonly Gen<Row> RowGen =
        Gen.Select(Gen.Double[1e-4, 12], Gen.Double[1e-3, 300], Gen.Double[0, 5], Gen.Double[10, 35], Gen.Double[0, 2],
            Gen.Int[0, 3], Gen.Int[0, 1_000_000],
            (z, th, te, mu, me, idKind, n) => new Row(z, th, te, mu, me, idKind switch
            {
                0 => $"G{n}",
                1 => $"J{n}+{n % 97}, field \"A\"", // needs quoting: comma and quotes
                2 => $"  padded {n}",               // leading spaces
                _ => $"#{n}",                       // would look like a comment at line start
            }));

    [Fact]
    public void RandomValidTablesRoundTripCsvToSampleToCsv()
    {
        Gen.Select(RowGen.Array[1, 40], Gen.Bool).Sample(c =>
        {
            var (rows, idFirst) = c;
            using var t = new TempFiles();
            var table = new CatalogueTable();
            void Ids() => table.AddText("id", rows.Select(r => (string?)r.Id).ToArray());
            if (idFirst) Ids();
            table.AddReal("z", rows.Select(r => r.Z).ToArray())
                .AddReal("theta", rows.Select(r => r.ThetaArcsec).ToArray())
                .AddReal("theta_err", rows.Select(r => r.ThetaErrArcsec).ToArray())
                .AddReal("mu", rows.Select(r => r.Mu).ToArray())
                .AddReal("mu_err", rows.Select(r => r.MuErr).ToArray());
            if (!idFirst) Ids();
            var p1 = t.PathOf("one.csv");
            CsvTableWriter.Write(p1, table);

            var load = CatalogueLoader.Load(p1);
            Assert.Equal(rows.Length, load.RowsRead);
            Assert.Equal(rows.Length, load.Accepted);
            var s = load.Rows;
            Assert.Equal(rows.Select(r => r.Z), s.Z);                 // exact: "R" formatting round-trips doubles
            Assert.Equal(rows.Select(r => r.Mu), s.Mu!);
            Assert.Equal(rows.Select(r => r.MuErr), s.MuErr!);
            Assert.Equal(rows.Select(r => r.Id), s.Id!);               // the writer quotes leading spaces, commas, quotes and a leading #
            for (int i = 0; i < rows.Length; i++)
                Rel.Equal(rows[i].ThetaArcsec * Math.PI / 648000, s.ThetaRad![i], 4e-16); // 1″ = π/648000 rad

            var p2 = t.PathOf("two.csv");
            CsvTableWriter.Write(p2, CatalogueTable.FromRows(s));
            var back = CatalogueLoader.Load(p2).Rows;
            Assert.Equal(s.Z, back.Z);
            Assert.Equal(s.Mu, back.Mu);
            Assert.Equal(s.Id, back.Id);
            for (int i = 0; i < rows.Length; i++)
            {
                // arcsec → rad → arcsec → rad: two roundings of a product, so within 2 ulp (relative 4.4e-16).
                Rel.Equal(s.ThetaRad![i], back.ThetaRad![i], 4.5e-16);
                Rel.Equal(rows[i].ThetaArcsec, s.ThetaRad[i] * AngleUnits.ArcsecPerRadian, 4.5e-16);
            }
        }, seed: Seed, iter: 60, threads: 1);
    }

    private static readonly string[] CorruptionSources = ["csv", "fixture_tables.fits", "fixture_tabledata.vot", "fixture_binary2.vot", "fixture_ipac.tbl"];

    private static byte[] Source(string name) => name == "csv"
        ? System.Text.Encoding.UTF8.GetBytes("# synthetic\nid,z,theta,theta_err,mu\nA,0.5,1.2,0.1,21\n\"B,x\",1.0,0.8,0.05,22\nC,2.0,0.4,0.02,23.5\n")
        : File.ReadAllBytes(ReferenceFiles.PathOf(name));

    [Fact]
    public void RandomCorruptionNeverCrashesOrHangs()
    {
        var sources = CorruptionSources.Select(Source).ToArray();
        // A case: which source, how to damage it (flip bytes / truncate / insert junk), where, and with which bytes.
        var gen = Gen.Select(Gen.Int[0, sources.Length - 1], Gen.Int[0, 2], Gen.Int[0, int.MaxValue].Array[1, 8], Gen.Byte.Array[1, 8]);
        int loads = 0, errors = 0;
        gen.Sample(c =>
        {
            var (src, mode, positions, junk) = c;
            var bytes = sources[src].ToList();
            switch (mode)
            {
                case 0:
                    for (int i = 0; i < positions.Length; i++) bytes[positions[i] % bytes.Count] = junk[i % junk.Length];
                    break;
                case 1:
                    bytes.RemoveRange(positions[0] % bytes.Count, bytes.Count - positions[0] % bytes.Count);
                    break;
                default:
                    bytes.InsertRange(positions[0] % bytes.Count, junk);
                    break;
            }
            using var t = new TempFiles();
            var ext = CorruptionSources[src] == "csv" ? ".csv" : Path.GetExtension(CorruptionSources[src]);
            var p = t.Write("damaged" + ext, bytes.ToArray());
            var task = Task.Run(() =>
            {
                try
                {
                    var load = CatalogueLoader.Load(p);
                    Assert.Equal(load.RowsRead, load.Accepted + load.Rejected);
                    Assert.Equal(load.Accepted, load.Rows.Count);
                    Interlocked.Increment(ref loads);
                }
                catch (InputException ex)
                {
                    Assert.Contains("damaged", ex.Message); // one clear error that names the file
                    Interlocked.Increment(ref errors);
                }
            });
            Assert.True(task.Wait(TimeSpan.FromSeconds(20)), $"loading hung: source {CorruptionSources[src]}, mode {mode}");
        }, seed: CorruptionSeed, iter: 300, threads: 1);
        Assert.True(loads > 0 && errors > 0, $"{loads} loads, {errors} errors: both outcomes should occur");
    }
}

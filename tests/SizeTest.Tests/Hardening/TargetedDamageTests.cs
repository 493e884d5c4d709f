using System.Buffers.Binary;
using System.Text;
using Xunit;
using Xunit.Abstractions;

namespace SizeTest.Tests.Hardening;

/// <summary>
/// Damage aimed at the size fields that random fuzzing rarely hits: FITS header cards (NAXIS1/NAXIS2/PCOUNT/GCOUNT/
/// TFIELDS/TFORMn set huge, negative or zero), the Parquet footer length and every byte of the Parquet footer
/// overwritten with a huge Thrift varint, and headers with thousands of equal column names (CSV, VOTable).
/// Each file must be read with every row accounted for or refused with one input error, under
/// <see cref="FuzzedInputTests.AllocationCeilingBytes"/> of allocation (see <see cref="FuzzedInputTests.ReadOrRefuse"/>).
/// </summary>
public sealed class TargetedDamageTests(ITestOutputHelper output)
{
    [Fact]
    public void FitsSizeCardsSetHugeNegativeOrZeroAreRefusedOrRead()
    {
        byte[] valid = File.ReadAllBytes(FuzzedInputTests.SeedFile("fits"));
        var cases = new List<(string Label, byte[] Bytes)>();
        foreach (var key in new[] { "NAXIS", "NAXIS1", "NAXIS2", "PCOUNT", "GCOUNT", "TFIELDS", "BITPIX" })
            foreach (var value in new[] { "2147483647", "2147483648", "999999999999999", "-1", "0", "41" })
                cases.Add(($"{key} = {value}", SetCard(valid, key, value)));
        foreach (var key in new[] { "TFORM1", "TFORM2" })
            foreach (var value in new[] { "'2147483647A'", "'2147483647D'", "'99999999999D'", "'0D'", "'-1D'", "'1PD(100000000)'", "'1QD'", "'X'" })
                cases.Add(($"{key} = {value}", SetCard(valid, key, value)));
        Check("fits", cases);
    }

    [Fact]
    public void ParquetFooterLengthsAndHugeVarintsInTheFooterAreRefused()
    {
        byte[] valid = File.ReadAllBytes(FuzzedInputTests.SeedFile("parquet"));
        int footer = BinaryPrimitives.ReadInt32LittleEndian(valid.AsSpan(valid.Length - 8));
        int start = valid.Length - 8 - footer;
        var cases = new List<(string Label, byte[] Bytes)>();
        foreach (int length in new[] { int.MaxValue, -5, 0, 3, valid.Length - 8, valid.Length + 1 })
        {
            var b = (byte[])valid.Clone();
            BinaryPrimitives.WriteInt32LittleEndian(b.AsSpan(b.Length - 8), length);
            cases.Add(($"footer length {length}", b));
        }
        // A 5-byte varint 0xFFFFFFFF07 (2³²−1, or −2³¹ zigzag-decoded) at every footer byte: where it lands on a
        // string length, list size or field, the library used to try to allocate it.
        for (int i = 0; i < footer - 5; i++)
        {
            var b = (byte[])valid.Clone();
            new byte[] { 0xFF, 0xFF, 0xFF, 0xFF, 0x07 }.CopyTo(b, start + i);
            cases.Add(($"huge varint at footer byte {i}", b));
        }
        Check("parquet", cases);
    }

    [Fact]
    public void ThousandsOfEqualColumnNamesAreNamedInLinearTime()
    {
        // 8 000 FIELDs called q took over four minutes (cubic-time renaming) before UniqueColumnNames; 5 000 here.
        string vot = File.ReadAllText(FuzzedInputTests.SeedFile("vot"));
        string fields = string.Concat(Enumerable.Repeat("<FIELD name=\"q\" datatype=\"double\"/>", 5_000));
        string csvHeader = string.Join(",", Enumerable.Repeat("q", 10_000));
        Check("vot", [("5000 FIELDs named q", Encoding.UTF8.GetBytes(vot.Replace("<DATA>", fields + "<DATA>")))]);
        Check("csv", [("10000 columns named q", Encoding.UTF8.GetBytes(csvHeader + "\n" + string.Join(",", Enumerable.Repeat("1", 10_000)) + "\n"))]);
        var names = new SizeTest.Catalogues.UniqueColumnNames();
        Assert.Equal(["q", "q_2", "q_3", "q_2_2", "q_4"], new[] { "q", "q", "q", "q_2", "q" }.Select(names.Take));
    }

    private void Check(string extension, List<(string Label, byte[] Bytes)> cases)
    {
        var dir = Directory.CreateTempSubdirectory("sizetest-targeted-").FullName;
        var failures = new List<string>();
        int refused = 0;
        long worst = 0;
        try
        {
            for (int k = 0; k < cases.Count; k++)
            {
                var path = Path.Combine(dir, $"t{k:D3}.{extension}");
                File.WriteAllBytes(path, cases[k].Bytes);
                if (FuzzedInputTests.ReadOrRefuse(path, $"{extension}: {cases[k].Label}", failures, out long allocated)) refused++;
                worst = Math.Max(worst, allocated);
            }
        }
        finally { Directory.Delete(dir, true); }
        output.WriteLine($"{extension}: {cases.Count} targeted files, {refused} refused as input errors; largest allocation {worst >> 10} KiB");
        Assert.True(failures.Count == 0, string.Join("\n", failures.Take(20)));
    }

    /// <summary>A copy of a FITS file with every card <paramref name="key"/> given <paramref name="value"/> (FITS 4.0 §4.1 fixed format).</summary>
    private static byte[] SetCard(byte[] fits, string key, string value)
    {
        var b = (byte[])fits.Clone();
        for (int i = 0; i + 80 <= b.Length; i += 80)
            if (Encoding.ASCII.GetString(b, i, 8).TrimEnd() == key)
                Encoding.ASCII.GetBytes($"{key,-8}= {value,20}".PadRight(80)).CopyTo(b, i);
        return b;
    }
}

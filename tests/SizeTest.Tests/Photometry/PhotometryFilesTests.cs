using SizeTest.Foundation.Errors;
using SizeTest.Photometry;
using Xunit;

namespace SizeTest.Tests.Photometry;

public sealed class PhotometryFilesTests
{
    [Fact]
    public void ReadsTablesFromDisk()
    {
        var dir = Directory.CreateTempSubdirectory("sizetest-phot-").FullName;
        var spec = Path.Combine(dir, "sed.txt");
        var filt = Path.Combine(dir, "r.dat");
        var zp = Path.Combine(dir, "zp.txt");
        File.WriteAllText(spec, "# synthetic\n100 1\n200 2\n");
        File.WriteAllText(filt, "wavelength,response\n550,0\n600,1\n650,0\n");
        File.WriteAllText(zp, "# Vega->AB, synthetic\nJ 0.91\n");
        var s = PhotometryFiles.ReadSpectrum(spec, SpectralDensity.PerFrequency, angstromPerUnit: 10);
        Assert.Equal(1000, s.MinLambdaAngstrom);   // 100 nm = 1000 Å
        var f = PhotometryFiles.ReadFilter(filt, angstromPerUnit: 10);
        Assert.Equal("r", f.Name);
        Assert.Equal(6000, f.PivotWavelengthAngstrom, 6000 * 1e-2);   // symmetric triangle: pivot ≈ centre (closed form within 1 %)
        var t = PhotometryFiles.ReadBandTable(zp, "AB zero-point offset");
        Assert.Contains("Vega->AB, synthetic", t.Source);
        File.WriteAllText(spec, "100 1\n50 2\n");
        var e = Assert.Throws<InputException>(() => PhotometryFiles.ReadSpectrum(spec, SpectralDensity.PerFrequency));
        Assert.Equal(spec, e.File);
        Assert.Contains("increase", e.Message);
        Directory.Delete(dir, recursive: true);
    }
}

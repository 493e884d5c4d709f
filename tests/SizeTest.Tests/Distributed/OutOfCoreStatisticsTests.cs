using SizeTest.Catalogs;
using SizeTest.Catalogs.Parquet;
using SizeTest.Distributed;
using SizeTest.Photometry;
using Xunit;

namespace SizeTest.Tests.Distributed;

public sealed class OutOfCoreStatisticsTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-ooc-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    // SYNTHETIC: 20 000 rows in row groups of 1500, errors quantised to three values, every 97th row with θ = −1 (rejected).
    private string WriteCatalogue()
    {
        const int n = 20_000;
        var z = new double[n]; var lnTheta = new double[n]; var err = new double[n];
        SyntheticKernelRows.Fill(17, 0, z, lnTheta, err);
        double[] levels = [0.05, 0.1, 0.2];
        var thetaArcsec = new double[n]; var thetaErrArcsec = new double[n];
        for (int i = 0; i < n; i++)
        {
            double th = Math.Exp(lnTheta[i]) * SizeTest.Common.Units.ArcsecPerRadian;
            thetaArcsec[i] = i % 97 == 0 ? -1 : th;
            thetaErrArcsec[i] = levels[i % 3] * th; // relative error → σ(ln θ) = level
        }
        var path = Path.Combine(_dir, "synthetic.parquet");
        ParquetTableWriter.Write(path, [ParquetColumnValues.Number("z", z), ParquetColumnValues.Number("theta", thetaArcsec), ParquetColumnValues.Number("theta_err", thetaErrArcsec)], 1500);
        return path;
    }

    [Fact]
    public void StreamedStatisticsEqualTheInMemoryLikelihoodAndKeepTheRowAccounting()
    {
        var path = WriteCatalogue();
        var grid = new LogRedshiftGrid(1e-3, 30, 4096);
        var options = new CatalogLoadOptions();

        var whole = CatalogLoader.Load(path, options);
        var obs = Observables.FromSample(whole.Sample);
        var columns = KernelColumns.Build(obs.Z, obs.LnTheta!, obs.LnThetaErr!, grid);
        var distances = grid.Nodes.Select(SyntheticKernelRows.EdsAngularDiameterDistanceMpc).ToArray();
        var model = new double[grid.Count];

        long read = 0, accepted = 0, rejected = 0;
        var parts = new List<SufficientStatistics>();
        for (int rank = 0; rank < 3; rank++)
        {
            var r = OutOfCoreStatistics.Build(path, options, grid, 3, 0.04 * 0.04, 0.25 * 0.25, rank, 3);
            read += r.RowsRead; accepted += r.Accepted; rejected += r.Rejected;
            parts.Add(r.Statistics);
            Assert.Equal(r.RowsRead, r.Accepted + r.Rejected);
        }
        Assert.Equal(whole.RowsRead, read);
        Assert.Equal(whole.Accepted, accepted);
        Assert.Equal(whole.Rejected, rejected);
        Assert.Equal(20_000 / 97 + 1, rejected); // rows 0, 97, 194, … have θ < 0

        foreach (var p in DistributedSelfCheck.CheckVectors)
        {
            AngularSizeModelGrid.FillFromDistances(grid, distances, p[0], p[1], model);
            double direct = GaussianGridKernel.LogLikelihoodScalar(columns, 0, columns.Count, model, p[2]);
            double streamed = parts.Sum(s => s.LogLikelihood(model, p[2]));
            // Exact up to rounding: each error level sits in its own variance class (σ_ln θ from θ_err/θ is the
            // level to ~1e-16, so the class spread is ~1e-15 and contributes far below the tolerance).
            Assert.True(Math.Abs(direct - streamed) <= 1e-9 * Math.Abs(direct), $"{streamed:R} vs {direct:R}");
        }
    }
}

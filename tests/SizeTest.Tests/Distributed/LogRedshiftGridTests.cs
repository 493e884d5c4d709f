using SizeTest.Distributed;
using Xunit;

namespace SizeTest.Tests.Distributed;

public sealed class LogRedshiftGridTests
{
    [Fact]
    public void NodesArePositionsZeroToCountMinusOne()
    {
        var grid = new LogRedshiftGrid(0.01, 10, 101);
        Assert.Equal(0.01, grid.Nodes[0]);
        Assert.Equal(10, grid.Nodes[^1]);
        for (int k = 0; k < grid.Count; k++) Assert.Equal(k, grid.Position(grid.Nodes[k]), 9); // t(z_k) = k by definition
        Assert.Equal(0, grid.Position(1e-6));   // clamped below
        Assert.Equal(100, grid.Position(1e6));  // clamped above
    }

    [Fact]
    public void InterpolatedAngularSizeModelIsWithinOneMillionthOfTheClosedForm()
    {
        // Interpolation error of the gridded model ln θ_model = ln R0 + a ln(1+z) − ln D_A(z) against the exact
        // per-object value, Einstein–de Sitter D_A in closed form (docs/science.md §1.4). Linear interpolation in
        // ln z bounds it by h²/8·max|f''| (common practice); for 2048 nodes on [1e-3, 10] that is ~1e-6.
        var grid = new LogRedshiftGrid(1e-3, 10, 2048);
        var distances = grid.Nodes.Select(SyntheticKernelRows.EdsAngularDiameterDistanceMpc).ToArray();
        var model = new double[grid.Count];
        AngularSizeModelGrid.FillFromDistances(grid, distances, Math.Log(5), -1.3, model);
        double worst = 0;
        for (double z = 1e-3; z <= 10; z *= 1.0007)
        {
            double exact = Math.Log(5) - 1.3 * Math.Log(1 + z) - Math.Log(SyntheticKernelRows.EdsAngularDiameterDistanceMpc(z) * 1000);
            worst = Math.Max(worst, Math.Abs(LogRedshiftGrid.Interpolate(model, grid.Position(z)) - exact));
        }
        Assert.True(worst < 1e-6, $"worst interpolation error {worst:E3}");
    }

    [Fact]
    public void CoveringGridContainsEveryRedshift()
    {
        double[] z = [0.3, 0.02, 4.5, 1];
        var grid = LogRedshiftGrid.Covering(z, 16);
        Assert.True(grid.ZMin < 0.02 && grid.ZMax > 4.5);
        Assert.Throws<ArgumentOutOfRangeException>(() => LogRedshiftGrid.Covering([0.1, -1.0]));
    }
}

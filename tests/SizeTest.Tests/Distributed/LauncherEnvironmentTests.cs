using SizeTest.Distributed;
using Xunit;

namespace SizeTest.Tests.Distributed;

public sealed class LauncherEnvironmentTests
{
    [Fact]
    public void NoLauncherVariablesMeansSingleProcess()
    {
        var env = LauncherEnvironment.From(_ => null);
        Assert.False(env.UnderLauncher);
        Assert.Null(env.ExpectedSize);
        Assert.IsType<SingleProcessReducer>(RankContext.Start(env));
    }

    [Fact]
    public void WrongLauncherIsReportedWithTheSizes()
    {
        var env = LauncherEnvironment.From(n => n switch { "PMI_SIZE" => "4", "PMI_RANK" => "0", _ => null });
        Assert.True(env.UnderLauncher);
        Assert.Equal(4, env.ExpectedSize);
        var message = env.CheckWorldSize(1, "Open MPI v4.1.4");
        Assert.NotNull(message);
        Assert.Contains("PMI_SIZE=4", message);
        Assert.Contains("world of 1", message);
        Assert.Null(env.CheckWorldSize(4, "Open MPI v4.1.4"));
    }

    [Fact]
    public void OpenMpiSizeVariableTakesPrecedence()
    {
        var env = LauncherEnvironment.From(n => n switch { "OMPI_COMM_WORLD_SIZE" => "2", "PMI_SIZE" => "8", _ => null });
        Assert.Equal(2, env.ExpectedSize);
    }

    [Fact]
    public void SingleProcessReducerCopiesSums()
    {
        var r = SingleProcessReducer.Instance;
        var total = new double[2];
        r.SumAll([1.5, -2], total);
        Assert.Equal([1.5, -2], total);
        Assert.True(r.IsRoot);
        Assert.Equal(1, r.Size);
    }

    [Fact]
    public void DistributedLogDensityOnOneProcessIsThePlainSum()
    {
        var d = new DistributedLogDensity(SingleProcessReducer.Instance, 2, p => p[0] * 10 + p[1]);
        Assert.Equal(32, d.LogDensity([3.0, 2.0]));
        var results = new double[2];
        d.LogDensities([1.0, 1.0, 2.0, 5.0], results);
        Assert.Equal([11.0, 25.0], results);
        Assert.Equal(3, d.Evaluations);
        d.Stop();
        Assert.Throws<InvalidOperationException>(() => d.LogDensity([1.0, 1.0]));
    }
}

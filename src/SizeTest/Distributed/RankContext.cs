using SizeTest.Foundation.Errors;

namespace SizeTest.Distributed;

/// <summary>
/// Starts the rank layer for one run: MPI when the process was started by an MPI launcher and an MPI
/// library can be loaded, otherwise a single process. Never loads MPI outside a launcher (a singleton
/// MPI start can be slow or fail where no MPI runtime is configured); <c>SIZETEST_MPI=off</c> disables MPI.
/// </summary>
public static class RankContext
{
    private static readonly object Gate = new();
    private static IRankReducer? _current;

    /// <summary>
    /// True when this process was started by an MPI launcher (and <c>SIZETEST_MPI</c> is not <c>off</c>): commands then take
    /// their distributed path, which calls <see cref="Start()"/> (and so detects a wrong launcher). Does not load MPI.
    /// </summary>
    public static bool IsDistributed =>
        LauncherEnvironment.FromProcess().UnderLauncher
        && !string.Equals(Environment.GetEnvironmentVariable("SIZETEST_MPI"), "off", StringComparison.OrdinalIgnoreCase);

    /// <summary>
    /// Returns the reducer for this process, starting MPI on first use (MPI can be initialised only once per
    /// process, so later calls return the same instance until it is disposed at exit).
    /// </summary>
    /// <exception cref="InputException">Started by a launcher for several processes, but no MPI library could be
    /// loaded, or the library's world size does not match the launcher's (wrong launcher).</exception>
    public static IRankReducer Start() => Start(LauncherEnvironment.FromProcess());

    /// <summary>As <see cref="Start()"/> with a given launcher environment.</summary>
    public static IRankReducer Start(LauncherEnvironment environment)
    {
        ArgumentNullException.ThrowIfNull(environment);
        lock (Gate)
        {
            if (_current is not null) return _current;
            if (!environment.UnderLauncher || string.Equals(Environment.GetEnvironmentVariable("SIZETEST_MPI"), "off", StringComparison.OrdinalIgnoreCase))
                return _current = SingleProcessReducer.Instance;
            if (!MpiLibrary.TryLoad(out var mpi, out var tried))
            {
                if (environment.ExpectedSize is null or 1) return _current = SingleProcessReducer.Instance;
                throw new InputException(
                    $"SizeTest was started by an MPI launcher for {environment.ExpectedSize} processes but no MPI library could be loaded (tried {tried}); "
                    + "install Open MPI or MPICH, or set SIZETEST_MPI_LIBRARY to the library's path.");
            }
            bool owns = !mpi!.IsInitialized;
            if (owns) mpi.Initialize();
            var reducer = new MpiReducer(mpi, owns);
            if (environment.CheckWorldSize(reducer.Size, $"{reducer.LibraryVersion} ({mpi.Path})") is { } problem)
            {
                reducer.Dispose();
                throw new InputException(problem);
            }
            AppDomain.CurrentDomain.ProcessExit += (_, _) => reducer.Dispose();
            return _current = reducer;
        }
    }
}

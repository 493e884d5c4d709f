namespace SizeTest.Distributed;

/// <summary>
/// What the environment says about an MPI launcher: launchers (Open MPI's mpirun, MPICH's Hydra
/// mpiexec, Slurm's srun with PMI/PMIx) set variables such as <c>OMPI_COMM_WORLD_SIZE</c>,
/// <c>PMI_SIZE</c> or <c>PMIX_RANK</c> in every process they start.
/// </summary>
/// <param name="Variables">The launcher variables found, name → value.</param>
/// <param name="ExpectedSize">World size the launcher announced, if it announced one.</param>
public sealed record LauncherEnvironment(IReadOnlyDictionary<string, string> Variables, int? ExpectedSize)
{
    /// <summary>Variables whose presence means "started by an MPI launcher".</summary>
    public static readonly string[] LauncherVariables =
        ["OMPI_COMM_WORLD_SIZE", "OMPI_COMM_WORLD_RANK", "PMI_SIZE", "PMI_RANK", "PMIX_RANK", "PMIX_NAMESPACE", "MPI_LOCALNRANKS", "MPI_LOCALRANKID"];

    /// <summary>Variables that carry the world size, in order of preference.</summary>
    public static readonly string[] SizeVariables = ["OMPI_COMM_WORLD_SIZE", "PMI_SIZE"];

    /// <summary>True when any launcher variable is present.</summary>
    public bool UnderLauncher => Variables.Count > 0;

    /// <summary>Reads the current process environment.</summary>
    public static LauncherEnvironment FromProcess() => From(name => Environment.GetEnvironmentVariable(name));

    /// <summary>Reads an environment given as a look-up function (for tests).</summary>
    public static LauncherEnvironment From(Func<string, string?> lookup)
    {
        ArgumentNullException.ThrowIfNull(lookup);
        var found = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var name in LauncherVariables)
            if (lookup(name) is { Length: > 0 } v) found[name] = v;
        int? size = null;
        foreach (var name in SizeVariables)
            if (found.TryGetValue(name, out var v) && int.TryParse(v, out var s) && s > 0) { size = s; break; }
        return new LauncherEnvironment(found, size);
    }

    /// <summary>
    /// Checks the world size MPI reports against the launcher's. Returns null when consistent, else one
    /// sentence explaining the mismatch (typically N copies of a single-rank job: the launcher belongs to a
    /// different MPI implementation than the library loaded).
    /// </summary>
    public string? CheckWorldSize(int worldSize, string libraryDescription)
    {
        if (ExpectedSize is not { } expected || expected == worldSize) return null;
        var source = SizeVariables.First(Variables.ContainsKey);
        return $"The MPI launcher started {expected} processes ({source}={expected}) but the MPI library {libraryDescription} "
             + $"reports a world of {worldSize}, so each process would run the whole job alone; start SizeTest with the launcher "
             + "that belongs to this library (Open MPI: mpirun; MPICH: mpiexec.hydra) or point SIZETEST_MPI_LIBRARY at the library of the launcher you use.";
    }
}

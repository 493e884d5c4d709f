using System.Runtime.InteropServices;
using System.Text;

namespace SizeTest.Distributed;

/// <summary>
/// A thin binding to the system MPI library (Open MPI or MPICH), loaded at run time so that SizeTest
/// runs as a single process where no MPI is installed. Only the calls a distributed likelihood needs:
/// Init_thread, Initialized, Comm_rank, Comm_size, Bcast and Allreduce (sum) of doubles, Barrier,
/// Abort, Finalize, Get_library_version.
/// </summary>
/// <remarks>
/// Handles differ by implementation: Open MPI's MPI_COMM_WORLD, MPI_DOUBLE and MPI_SUM are the addresses
/// of the exported globals <c>ompi_mpi_comm_world</c>, <c>ompi_mpi_double</c> and <c>ompi_mpi_op_sum</c>;
/// MPICH uses integer constants (MPI_COMM_WORLD = 0x44000000, MPI_DOUBLE = 0x4c00080b, MPI_SUM = 0x58000003,
/// from MPICH's mpi.h as recorded in the project's stack notes). Both are passed as a native-width
/// integer, which the C calling conventions on x86-64 and arm64 read correctly as int or pointer.
/// </remarks>
internal sealed unsafe class MpiLibrary
{
    private const int MpiSuccess = 0;
    private const int ThreadSerialized = 2; // MPI_THREAD_SERIALIZED, same value in Open MPI and MPICH

    private readonly delegate* unmanaged[Cdecl]<int*, byte***, int, int*, int> _initThread;
    private readonly delegate* unmanaged[Cdecl]<int*, int> _initialized;
    private readonly delegate* unmanaged[Cdecl]<int*, int> _finalized;
    private readonly delegate* unmanaged[Cdecl]<nint, int*, int> _commRank;
    private readonly delegate* unmanaged[Cdecl]<nint, int*, int> _commSize;
    private readonly delegate* unmanaged[Cdecl]<void*, int, nint, int, nint, int> _bcast;
    private readonly delegate* unmanaged[Cdecl]<void*, void*, int, nint, nint, nint, int> _allreduce;
    private readonly delegate* unmanaged[Cdecl]<nint, int> _barrier;
    private readonly delegate* unmanaged[Cdecl]<nint, int, int> _abort;
    private readonly delegate* unmanaged[Cdecl]<int> _finalize;
    private readonly delegate* unmanaged[Cdecl]<byte*, int*, int> _libraryVersion;
    private readonly nint _commWorld, _double, _sum;

    /// <summary>Library names tried in order when <c>SIZETEST_MPI_LIBRARY</c> is not set.</summary>
    internal static readonly string[] CandidateNames =
        ["libmpi.so.40", "libmpi.so.12", "libmpich.so.12", "libmpi.so", "libmpich.so", "libmpi.dylib", "libmpich.dylib"];

    private MpiLibrary(nint handle, string path)
    {
        Path = path;
        _initThread = (delegate* unmanaged[Cdecl]<int*, byte***, int, int*, int>)NativeLibrary.GetExport(handle, "MPI_Init_thread");
        _initialized = (delegate* unmanaged[Cdecl]<int*, int>)NativeLibrary.GetExport(handle, "MPI_Initialized");
        _finalized = (delegate* unmanaged[Cdecl]<int*, int>)NativeLibrary.GetExport(handle, "MPI_Finalized");
        _commRank = (delegate* unmanaged[Cdecl]<nint, int*, int>)NativeLibrary.GetExport(handle, "MPI_Comm_rank");
        _commSize = (delegate* unmanaged[Cdecl]<nint, int*, int>)NativeLibrary.GetExport(handle, "MPI_Comm_size");
        _bcast = (delegate* unmanaged[Cdecl]<void*, int, nint, int, nint, int>)NativeLibrary.GetExport(handle, "MPI_Bcast");
        _allreduce = (delegate* unmanaged[Cdecl]<void*, void*, int, nint, nint, nint, int>)NativeLibrary.GetExport(handle, "MPI_Allreduce");
        _barrier = (delegate* unmanaged[Cdecl]<nint, int>)NativeLibrary.GetExport(handle, "MPI_Barrier");
        _abort = (delegate* unmanaged[Cdecl]<nint, int, int>)NativeLibrary.GetExport(handle, "MPI_Abort");
        _finalize = (delegate* unmanaged[Cdecl]<int>)NativeLibrary.GetExport(handle, "MPI_Finalize");
        _libraryVersion = (delegate* unmanaged[Cdecl]<byte*, int*, int>)NativeLibrary.GetExport(handle, "MPI_Get_library_version");
        if (NativeLibrary.TryGetExport(handle, "ompi_mpi_comm_world", out var comm))
        {
            Flavour = "Open MPI";
            _commWorld = comm;
            _double = NativeLibrary.GetExport(handle, "ompi_mpi_double");
            _sum = NativeLibrary.GetExport(handle, "ompi_mpi_op_sum");
        }
        else
        {
            Flavour = "MPICH";
            _commWorld = 0x44000000;
            _double = 0x4c00080b;
            _sum = 0x58000003;
        }
    }

    /// <summary>File the library was loaded from (as given to the loader).</summary>
    public string Path { get; }

    /// <summary>"Open MPI" or "MPICH" (MPICH-compatible integer handles).</summary>
    public string Flavour { get; }

    /// <summary>
    /// Loads the MPI library named by <c>SIZETEST_MPI_LIBRARY</c>, or the first of <see cref="CandidateNames"/> that loads
    /// and exports the needed functions. Returns false (and the names tried) if none does.
    /// </summary>
    public static bool TryLoad(out MpiLibrary? library, out string tried)
    {
        library = null;
        var names = Environment.GetEnvironmentVariable("SIZETEST_MPI_LIBRARY") is { Length: > 0 } explicitName
            ? new[] { explicitName } : CandidateNames;
        tried = string.Join(", ", names);
        foreach (var name in names)
        {
            if (!NativeLibrary.TryLoad(name, typeof(MpiLibrary).Assembly, DllImportSearchPath.SafeDirectories | DllImportSearchPath.UseDllDirectoryForDependencies, out var handle)
                && !NativeLibrary.TryLoad(name, out handle))
                continue;
            if (!NativeLibrary.TryGetExport(handle, "MPI_Allreduce", out _)) continue;
            try { library = new MpiLibrary(handle, name); return true; }
            catch (EntryPointNotFoundException) { }
        }
        return false;
    }

    private static void Check(int rc, string call)
    {
        if (rc != MpiSuccess) throw new InvalidOperationException($"{call} failed with MPI error code {rc}.");
    }

    /// <summary>MPI_Initialized.</summary>
    public bool IsInitialized { get { int flag; Check(_initialized(&flag), "MPI_Initialized"); return flag != 0; } }

    /// <summary>MPI_Finalized.</summary>
    public bool IsFinalized { get { int flag; Check(_finalized(&flag), "MPI_Finalized"); return flag != 0; } }

    /// <summary>MPI_Init_thread requesting MPI_THREAD_SERIALIZED; returns the level provided.</summary>
    public int Initialize()
    {
        int provided;
        Check(_initThread(null, null, ThreadSerialized, &provided), "MPI_Init_thread");
        return provided;
    }

    /// <summary>Rank in MPI_COMM_WORLD.</summary>
    public int Rank { get { int r; Check(_commRank(_commWorld, &r), "MPI_Comm_rank"); return r; } }

    /// <summary>Size of MPI_COMM_WORLD.</summary>
    public int Size { get { int s; Check(_commSize(_commWorld, &s), "MPI_Comm_size"); return s; } }

    /// <summary>MPI_Bcast of doubles from <paramref name="root"/>.</summary>
    public void Broadcast(Span<double> buffer, int root)
    {
        fixed (double* p = buffer) Check(_bcast(p, buffer.Length, _double, root, _commWorld), "MPI_Bcast");
    }

    /// <summary>MPI_Allreduce with MPI_SUM of doubles.</summary>
    public void AllreduceSum(ReadOnlySpan<double> send, Span<double> receive)
    {
        fixed (double* s = send)
        fixed (double* r = receive)
            Check(_allreduce(s, r, send.Length, _double, _sum, _commWorld), "MPI_Allreduce");
    }

    /// <summary>MPI_Barrier.</summary>
    public void Barrier() => Check(_barrier(_commWorld), "MPI_Barrier");

    /// <summary>MPI_Abort on MPI_COMM_WORLD (ends every rank).</summary>
    public void Abort(int code) => _abort(_commWorld, code);

    /// <summary>MPI_Finalize.</summary>
    public void FinalizeMpi() => Check(_finalize(), "MPI_Finalize");

    /// <summary>MPI_Get_library_version, first line.</summary>
    public string LibraryVersion()
    {
        var buffer = new byte[8192]; // ≥ MPI_MAX_LIBRARY_VERSION_STRING in both implementations
        int length;
        fixed (byte* p = buffer) Check(_libraryVersion(p, &length), "MPI_Get_library_version");
        var text = Encoding.UTF8.GetString(buffer, 0, Math.Clamp(length, 0, buffer.Length)).TrimEnd('\0');
        int nl = text.IndexOfAny(['\n', ',']);
        return (nl > 0 ? text[..nl] : text).Trim();
    }
}

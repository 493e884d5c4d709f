using System.Runtime.InteropServices;

namespace SizeTest.Foundation.Files;

/// <summary>
/// What the file system forbids changing, asked before a long run so that replacing an output folder is
/// refused at the start rather than after the work: the Linux inode flags that bind even root,
/// <c>FS_IMMUTABLE_FL</c> (<c>chattr +i</c>: no rename, delete or write) and <c>FS_APPEND_FL</c>
/// (<c>chattr +a</c>: no delete or rename), read with <c>ioctl(fd, FS_IOC_GETFLAGS)</c> (linux/fs.h), and
/// write permission on a folder (<c>access(path, W_OK)</c>, POSIX). Where the platform or the file system does
/// not answer, the answer is "not locked", so these checks only refuse early what the final rename or delete
/// would refuse anyway.
/// </summary>
public static partial class FileSystemLocks
{
    private const int WriteOk = 2;
    private const int OpenReadOnly = 0, OpenNonBlock = 0x800, OpenNoFollow = 0x20000, OpenCloseOnExec = 0x80000;
    private const uint FsImmutable = 0x10, FsAppendOnly = 0x20;
    // _IOR('f', 1, long) with an 8-byte long (x86-64, arm64): (2 << 30) | (8 << 16) | ('f' << 8) | 1.
    private const ulong GetFlagsRequest = 0x80086601;

    /// <summary>True when <paramref name="path"/> (a file or folder, not followed through a symbolic link)
    /// carries the immutable or append-only flag.</summary>
    public static bool IsImmutable(string path)
    {
        if (!OperatingSystem.IsLinux()) return false;
        int fd = Open(path, OpenReadOnly | OpenNonBlock | OpenNoFollow | OpenCloseOnExec);
        if (fd < 0) return false;
        try
        {
            ulong flags = 0;
            return GetFlags(fd, GetFlagsRequest, ref flags) == 0 && ((uint)flags & (FsImmutable | FsAppendOnly)) != 0;
        }
        finally { Close(fd); }
    }

    /// <summary>True when entries may be created and deleted in the folder <paramref name="path"/> by this
    /// process (write permission, no immutable flag); true where the platform cannot tell.</summary>
    public static bool CanChangeFolder(string path) =>
        !OperatingSystem.IsLinux() || (Access(path, WriteOk) == 0 && !IsImmutable(path));

    [LibraryImport("libc", EntryPoint = "access", StringMarshalling = StringMarshalling.Utf8)]
    private static partial int Access(string path, int mode);

    [LibraryImport("libc", EntryPoint = "open", StringMarshalling = StringMarshalling.Utf8)]
    private static partial int Open(string path, int flags);

    [LibraryImport("libc", EntryPoint = "ioctl")]
    private static partial int GetFlags(int fd, ulong request, ref ulong flags);

    [LibraryImport("libc", EntryPoint = "close")]
    private static partial int Close(int fd);
}

using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Files;
using Xunit;

namespace SizeTest.Tests.Foundation;

public sealed class AtomicFileTests
{
    [Fact]
    public void FailedWriteLeavesOldContentAndNoTemporaryFile()
    {
        var dir = Directory.CreateTempSubdirectory("sizetest-atomic-").FullName;
        var path = Path.Combine(dir, "out.txt");
        AtomicFile.WriteAllText(path, "old");
        Assert.Throws<InvalidOperationException>(() =>
            AtomicFile.Write(path, s => { s.WriteByte(1); throw new InvalidOperationException("boom"); }));
        Assert.Equal("old", File.ReadAllText(path));
        Assert.Single(Directory.GetFiles(dir));
    }

    [Fact]
    public void OutputFolderRefusesNonEmptyTargetWithoutForceAndForeignFilesWithIt()
    {
        var dir = Directory.CreateTempSubdirectory("sizetest-out-").FullName;
        File.WriteAllText(Path.Combine(dir, "keep.txt"), "user data");
        Assert.Throws<InputException>(() => OutputFolder.Begin(dir, force: false));
        Assert.Throws<InputException>(() => OutputFolder.Begin(dir, force: true));   // not written by sizetest
        Assert.Equal("user data", File.ReadAllText(Path.Combine(dir, "keep.txt")));
        File.Delete(Path.Combine(dir, "keep.txt"));
        var folder = OutputFolder.Begin(dir, force: false);
        File.WriteAllText(folder.PathOf("new.txt"), "x");
        folder.Commit();
        Assert.True(File.Exists(Path.Combine(dir, "new.txt")));
        Assert.Contains("new.txt", OutputFolder.ReadMarker(dir)!);
    }
}

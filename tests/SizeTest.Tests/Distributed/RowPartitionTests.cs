using CsCheck;
using SizeTest.Distributed;
using Xunit;

namespace SizeTest.Tests.Distributed;

public sealed class RowPartitionTests
{
    [Fact]
    public void RowRangesCoverEveryRowExactlyOnce()
    {
        Gen.Long[0, 1_000_000].Select(Gen.Int[1, 64]).Sample((rows, size) =>
        {
            long next = 0;
            for (int r = 0; r < size; r++)
            {
                var (s, e) = RowPartition.RowRange(rows, r, size);
                Assert.Equal(next, s);
                Assert.True(e - s >= rows / size && e - s <= rows / size + 1);
                next = e;
            }
            Assert.Equal(rows, next);
        }, iter: 500, seed: "0Ac5H0gM9A3K");
    }

    [Fact]
    public void RowGroupsCoverEveryGroupExactlyOnceAndInOrder()
    {
        Gen.Long[0, 100_000].Array[0, 40].Select(Gen.Int[1, 9]).Sample((groups, size) =>
        {
            int next = 0;
            for (int r = 0; r < size; r++)
            {
                var (first, end) = RowPartition.RowGroups(groups, r, size);
                Assert.Equal(next, first);
                Assert.True(end >= first);
                next = end;
            }
            Assert.Equal(groups.Length, next);
        }, iter: 500, seed: "0Zc1HSgM2A1K");
    }

    [Fact]
    public void EqualGroupsAreSharedEvenly()
    {
        var groups = Enumerable.Repeat(1000L, 8).ToArray();
        Assert.Equal((0, 2), RowPartition.RowGroups(groups, 0, 4));
        Assert.Equal((6, 8), RowPartition.RowGroups(groups, 3, 4));
    }
}

namespace SizeTest.Distributed;

/// <summary>
/// Splits a catalogue between ranks: contiguous row ranges [start, end) for formats without row groups,
/// or whole row groups (for Parquet) balanced by row count. Every row belongs to exactly one rank.
/// </summary>
public static class RowPartition
{
    /// <summary>Rows [start, end) of rank <paramref name="rank"/> out of <paramref name="size"/> for <paramref name="rowCount"/> rows (sizes differ by at most one).</summary>
    public static (long Start, long End) RowRange(long rowCount, int rank, int size)
    {
        if (rowCount < 0) throw new ArgumentOutOfRangeException(nameof(rowCount));
        if (size < 1 || rank < 0 || rank >= size) throw new ArgumentOutOfRangeException(nameof(rank), $"rank {rank} of {size}");
        long q = rowCount / size, r = rowCount % size;
        long start = rank * q + Math.Min(rank, r);
        return (start, start + q + (rank < r ? 1 : 0));
    }

    /// <summary>
    /// Row groups [first, end) of rank <paramref name="rank"/>: group g goes to the rank whose share of rows
    /// contains the group's first row, so ranks get contiguous groups with nearly equal row counts.
    /// <paramref name="groupRowCounts"/> lists the rows of each group in file order.
    /// </summary>
    public static (int First, int End) RowGroups(IReadOnlyList<long> groupRowCounts, int rank, int size)
    {
        ArgumentNullException.ThrowIfNull(groupRowCounts);
        if (size < 1 || rank < 0 || rank >= size) throw new ArgumentOutOfRangeException(nameof(rank), $"rank {rank} of {size}");
        long total = 0;
        foreach (var c in groupRowCounts) total += c;
        int first = -1, end = 0;
        long offset = 0;
        for (int g = 0; g < groupRowCounts.Count; g++)
        {
            // owner of the group's midpoint, so a big group is not always given to the earlier rank
            long mid = offset + groupRowCounts[g] / 2;
            int owner = total == 0 ? 0 : (int)Math.Min(size - 1, (double)mid * size / total);
            if (owner == rank) { if (first < 0) first = g; end = g + 1; }
            offset += groupRowCounts[g];
        }
        if (first < 0)
        {
            // no group for this rank: an empty range placed after the groups of lower ranks
            int before = 0;
            offset = 0;
            for (int g = 0; g < groupRowCounts.Count; g++)
            {
                long mid = offset + groupRowCounts[g] / 2;
                int owner = total == 0 ? 0 : (int)Math.Min(size - 1, (double)mid * size / total);
                if (owner < rank) before = g + 1;
                offset += groupRowCounts[g];
            }
            return (before, before);
        }
        return (first, end);
    }
}

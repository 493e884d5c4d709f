namespace SizeTest.Distributed;

/// <summary>Only rank 0 writes output: helpers that make the other ranks' writes vanish.</summary>
public static class RootOutput
{
    /// <summary><paramref name="writer"/> on rank 0, <see cref="TextWriter.Null"/> on every other rank.</summary>
    public static TextWriter Writer(IRankReducer ranks, TextWriter writer)
    {
        ArgumentNullException.ThrowIfNull(ranks);
        ArgumentNullException.ThrowIfNull(writer);
        return ranks.IsRoot ? writer : TextWriter.Null;
    }

    /// <summary>Runs <paramref name="write"/> on rank 0 only; returns whether it ran.</summary>
    public static bool OnRoot(IRankReducer ranks, Action write)
    {
        ArgumentNullException.ThrowIfNull(ranks);
        ArgumentNullException.ThrowIfNull(write);
        if (!ranks.IsRoot) return false;
        write();
        return true;
    }
}

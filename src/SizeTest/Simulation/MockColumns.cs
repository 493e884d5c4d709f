namespace SizeTest.Simulation;

/// <summary>Internal column storage of drawn objects (one chunk, or the whole catalogue).</summary>
internal sealed class MockColumns
{
    public MockColumns(int capacity)
    {
        ZObs = new double[capacity];
        ZErr = new double[capacity];
        ZTrue = new double[capacity];
        ThetaObs = new double[capacity];
        ThetaErr = new double[capacity];
        ThetaTrue = new double[capacity];
        MuObs = new double[capacity];
        MuErr = new double[capacity];
        MuTrue = new double[capacity];
        Mag = new double[capacity];
        LogL = new double[capacity];
        SizeKpc = new double[capacity];
        AbsMag = new double[capacity];
        FluxJy = new double[capacity];
        Group = new int[capacity];
    }

    public int Count;
    public double[] ZObs, ZErr, ZTrue, ThetaObs, ThetaErr, ThetaTrue, MuObs, MuErr, MuTrue, Mag, LogL, SizeKpc, AbsMag, FluxJy;
    public int[] Group;

    /// <summary>Copies rows [from, from + n) of <paramref name="src"/> to the end of this store.</summary>
    public void Append(MockColumns src, int from, int n)
    {
        Array.Copy(src.ZObs, from, ZObs, Count, n);
        Array.Copy(src.ZErr, from, ZErr, Count, n);
        Array.Copy(src.ZTrue, from, ZTrue, Count, n);
        Array.Copy(src.ThetaObs, from, ThetaObs, Count, n);
        Array.Copy(src.ThetaErr, from, ThetaErr, Count, n);
        Array.Copy(src.ThetaTrue, from, ThetaTrue, Count, n);
        Array.Copy(src.MuObs, from, MuObs, Count, n);
        Array.Copy(src.MuErr, from, MuErr, Count, n);
        Array.Copy(src.MuTrue, from, MuTrue, Count, n);
        Array.Copy(src.Mag, from, Mag, Count, n);
        Array.Copy(src.LogL, from, LogL, Count, n);
        Array.Copy(src.SizeKpc, from, SizeKpc, Count, n);
        Array.Copy(src.AbsMag, from, AbsMag, Count, n);
        Array.Copy(src.FluxJy, from, FluxJy, Count, n);
        Array.Copy(src.Group, from, Group, Count, n);
        Count += n;
    }
}

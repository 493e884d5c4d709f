using System.Globalization;
using SizeTest.Foundation.Errors;

namespace SizeTest.Foundation.Files;

/// <summary>
/// Checks the memory a run will need BEFORE it allocates: callers estimate bytes from the sizes asked for
/// (objects × bytes per object, walkers × steps × dimension, resamples, starts, live points, mocks) and this
/// refuses, with an <see cref="InputException"/> (exit 2) giving the estimate, anything beyond the memory the
/// machine has available (Linux: <c>MemAvailable</c> of <c>/proc/meminfo</c>) or beyond the user's
/// <c>--max-memory</c>.
/// </summary>
public static class ResourceBudget
{
    /// <summary>Memory available to this process now, bytes: MemAvailable, else the GC's view of the machine.</summary>
    public static long AvailableBytes()
    {
        try
        {
            if (File.Exists("/proc/meminfo"))
                foreach (var line in File.ReadLines("/proc/meminfo"))
                    if (line.StartsWith("MemAvailable:", StringComparison.Ordinal))
                        return long.Parse(line[13..].Trim().Split(' ')[0], CultureInfo.InvariantCulture) * 1024;
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or FormatException) { }
        return GC.GetGCMemoryInfo().TotalAvailableMemoryBytes;
    }

    /// <summary>
    /// Refuses <paramref name="estimatedBytes"/> for <paramref name="what"/> when it exceeds <paramref name="maxMemoryBytes"/>
    /// (when given) or the available memory.
    /// </summary>
    /// <param name="what">What needs the memory, with the settings that size it (e.g. <c>the MCMC chains ({walkers} × {steps})</c>, settings as in <see cref="SettingProblem"/>).</param>
    /// <param name="estimatedBytes">The estimate (a double, so products of huge counts cannot overflow).</param>
    /// <param name="maxMemoryBytes">The user's limit, or null.</param>
    public static void Check(string what, double estimatedBytes, long? maxMemoryBytes)
    {
        if (maxMemoryBytes is { } max && estimatedBytes > max)
            throw SettingProblem.Input($"{new SettingText(what)} would need about {Format(estimatedBytes)}, more than {{max_memory}} {Format(max)}; ask for less or raise {{max_memory}} (memory budget checked before any allocation)");
        long avail = AvailableBytes();
        if (avail > 0 && estimatedBytes > avail)
            throw new InputException($"{what} would need about {Format(estimatedBytes)}, more than the {Format(avail)} of memory available on this machine; ask for less (memory budget checked before any allocation)");
    }

    /// <summary>Parses a size: a number of bytes with an optional suffix K, M, G, T (powers of 1024; e.g. <c>4G</c>, <c>512M</c>, <c>1e9</c>).</summary>
    /// <exception cref="InputException">Not a positive size.</exception>
    public static long ParseSize(string text, string setting = "max_memory")
    {
        var t = (text ?? "").Trim();
        double factor = 1;
        if (t.Length > 0)
        {
            char last = char.ToUpperInvariant(t[^1]);
            if (last == 'B') { t = t[..^1]; last = t.Length > 0 ? char.ToUpperInvariant(t[^1]) : ' '; if (last == 'I') { t = t[..^1]; last = t.Length > 0 ? char.ToUpperInvariant(t[^1]) : ' '; } }
            int idx = "KMGT".IndexOf(last);
            if (idx >= 0) { factor = Math.Pow(1024, idx + 1); t = t[..^1]; }
        }
        if (!double.TryParse(t, NumberStyles.Float, CultureInfo.InvariantCulture, out var v) || !(v * factor >= 1) || !double.IsFinite(v * factor) || v * factor > long.MaxValue)
            throw SettingProblem.Input($"{SettingProblem.Name(setting)} must be a size such as 4G, 512M or 1e9 (bytes); got '{text}'");
        return (long)(v * factor);
    }

    /// <summary>A byte count for messages (e.g. <c>3.2 GB</c>, binary units).</summary>
    public static string Format(double bytes)
    {
        string[] units = ["bytes", "KB", "MB", "GB", "TB", "PB", "EB"];
        int u = 0;
        while (bytes >= 1024 && u < units.Length - 1) { bytes /= 1024; u++; }
        return u == 0 ? $"{bytes:0} bytes" : (bytes < 1e6 ? bytes.ToString("0.##", CultureInfo.InvariantCulture) : bytes.ToString("0.##E+0", CultureInfo.InvariantCulture)) + " " + units[u];
    }
}

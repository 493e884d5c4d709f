using System.Reflection;
using SkiaSharp;

namespace SizeTest.Reporting.Rendering;

/// <summary>
/// The fonts every figure and report uses: DejaVu Sans regular and bold, shipped inside the
/// library as embedded resources (from Debian's fonts-dejavu-core 2.37; licence in
/// <c>Reporting/Fonts/DejaVu-LICENSE.txt</c>) so text renders on a machine with no fonts
/// installed. Never falls back to system fonts: a missing resource is an error, not blank text.
/// </summary>
public static class FontRegistry
{
    /// <summary>The family name figures and reports ask for.</summary>
    public const string Family = "DejaVu Sans";

    private static readonly Lazy<byte[]> RegularBytes = new(() => Load("DejaVuSans.ttf"));
    private static readonly Lazy<byte[]> BoldBytes = new(() => Load("DejaVuSans-Bold.ttf"));
    private static readonly Lazy<SKTypeface> RegularFace = new(() => Create(RegularBytes.Value));
    private static readonly Lazy<SKTypeface> BoldFace = new(() => Create(BoldBytes.Value));
    private static readonly Lazy<SKTypeface> MonoFace = new(() => Create(Load("DejaVuSansMono.ttf")));

    /// <summary>DejaVu Sans Mono (code blocks: the study file in the PDF report).</summary>
    public static SKTypeface Mono => MonoFace.Value;

    /// <summary>DejaVu Sans regular.</summary>
    public static SKTypeface Regular => RegularFace.Value;

    /// <summary>DejaVu Sans bold.</summary>
    public static SKTypeface Bold => BoldFace.Value;

    /// <summary>The raw TrueType bytes of the regular face (for embedding in HTML as a web font).</summary>
    public static ReadOnlyMemory<byte> RegularFontFile => RegularBytes.Value;

    /// <summary>The raw TrueType bytes of the bold face.</summary>
    public static ReadOnlyMemory<byte> BoldFontFile => BoldBytes.Value;

    /// <summary>The font licence text shipped with the fonts.</summary>
    public static string LicenceText => System.Text.Encoding.UTF8.GetString(Load("DejaVu-LICENSE.txt"));

    private static byte[] Load(string file)
    {
        var asm = typeof(FontRegistry).Assembly;
        var name = asm.GetManifestResourceNames().FirstOrDefault(n => n.EndsWith("." + file, StringComparison.Ordinal))
                   ?? throw new InvalidOperationException($"embedded font resource '{file}' is missing from {asm.GetName().Name}");
        using var s = asm.GetManifestResourceStream(name)!;
        using var ms = new MemoryStream();
        s.CopyTo(ms);
        return ms.ToArray();
    }

    private static SKTypeface Create(byte[] bytes)
    {
        var data = SKData.CreateCopy(bytes);
        return SKTypeface.FromData(data)
               ?? throw new InvalidOperationException("embedded DejaVu Sans could not be loaded by SkiaSharp");
    }
}

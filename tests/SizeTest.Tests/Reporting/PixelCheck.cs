using SkiaSharp;

namespace SizeTest.Tests.Reporting;

/// <summary>Counts dark pixels (text-like) in regions of a rendered PNG.</summary>
internal static class PixelCheck
{
    /// <summary>Pixels with luminance below 110 (of 255) inside the rectangle (clipped to the image).</summary>
    public static int DarkPixels(SKBitmap bmp, SKRectI r)
    {
        int n = 0;
        for (int y = Math.Max(0, r.Top); y < Math.Min(bmp.Height, r.Bottom); y++)
        for (int x = Math.Max(0, r.Left); x < Math.Min(bmp.Width, r.Right); x++)
        {
            var c = bmp.GetPixel(x, y);
            double lum = 0.2126 * c.Red + 0.7152 * c.Green + 0.0722 * c.Blue;
            if (lum < 110 && c.Alpha > 128) n++;
        }
        return n;
    }

    /// <summary>Pixels that differ from white by more than 10 in any channel.</summary>
    public static int NonWhite(SKBitmap bmp)
    {
        int n = 0;
        for (int y = 0; y < bmp.Height; y += 2)
        for (int x = 0; x < bmp.Width; x += 2)
        {
            var c = bmp.GetPixel(x, y);
            if (c.Red < 245 || c.Green < 245 || c.Blue < 245) n++;
        }
        return n;
    }
}

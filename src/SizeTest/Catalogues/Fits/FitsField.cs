using System.Globalization;
using System.Text.RegularExpressions;
using SizeTest.Foundation.Errors;

namespace SizeTest.Catalogues.Fits;

/// <summary>One BINTABLE field (TFORMn and its companions, FITS Standard 4.0 §7.3).</summary>
internal sealed partial class FitsField
{
    public required int Number { get; init; }            // n of TFORMn, 1-based
    public required string Name { get; init; }
    public required char Code { get; init; }             // L X B I J K A E D C M P Q
    public required long Repeat { get; init; }
    public required int Width { get; init; }             // bytes in the row
    public required int Offset { get; init; }            // byte offset in the row
    public required double Scale { get; init; }
    public required double Zero { get; init; }
    public required long? Null { get; init; }            // TNULLn (integer types)
    public required string? Unit { get; init; }
    public required string? Ucd { get; init; }
    public required string? Description { get; init; }
    public required string Form { get; init; }

    /// <summary>Bytes of one element.</summary>
    public int ElementBytes => Code switch
    {
        'L' or 'B' or 'A' => 1,
        'I' => 2,
        'J' or 'E' => 4,
        'K' or 'D' or 'C' or 'P' => 8,
        'M' or 'Q' => 16,
        _ => 0,
    };

    /// <summary>Whether scaling changes the values (so integers become reals).</summary>
    public bool IsScaled => Scale != 1.0 || Zero != Math.Round(Zero);

    [GeneratedRegex(@"^\s*(\d*)\s*([LXBIJKAEDCMPQ])(.*)$")]
    private static partial Regex FormPattern();

    /// <summary>Parses TFORMn into repeat count, type code and row width (§7.3.1, Table 18).</summary>
    public static (long Repeat, char Code, long Width) ParseForm(string form, int n, string path, int hdu)
    {
        var m = FormPattern().Match(form ?? "");
        if (!m.Success)
            throw new InputException($"HDU {hdu} has TFORM{n} = '{form}', which is not a FITS binary-table format", path);
        long repeat = m.Groups[1].Value.Length == 0 ? 1 : long.TryParse(m.Groups[1].Value, NumberStyles.None, CultureInfo.InvariantCulture, out var r) ? r : -1;
        if (repeat < 0 || repeat > int.MaxValue)
            throw new InputException($"HDU {hdu} has TFORM{n} = '{form}' with an unusable repeat count", path);
        char code = m.Groups[2].Value[0];
        long width = code switch
        {
            'X' => (repeat + 7) / 8,
            'P' => repeat == 0 ? 0 : 8,
            'Q' => repeat == 0 ? 0 : 16,
            'L' or 'B' or 'A' => repeat,
            'I' => 2 * repeat,
            'J' or 'E' => 4 * repeat,
            'K' or 'D' or 'C' => 8 * repeat,
            'M' => 16 * repeat,
            _ => throw new InputException($"HDU {hdu} has TFORM{n} = '{form}' with unknown type '{code}'", path),
        };
        return (repeat, code, width);
    }
}

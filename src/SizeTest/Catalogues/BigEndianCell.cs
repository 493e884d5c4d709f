using System.Buffers.Binary;

namespace SizeTest.Catalogues;

/// <summary>
/// The numeric cells of the binary table formats, all big-endian: FITS BINTABLE (Pence et al. 2010, A&amp;A 524, A42,
/// §7.3.3: B unsigned byte, I/J/K 16/32/64-bit two's complement, E/D IEEE 754 single/double) and VOTable BINARY/BINARY2
/// (VOTable 1.4 §5.4: unsignedByte, short, int, long, float, double). One decoder for both readers.
/// </summary>
internal static class BigEndianCell
{
    /// <summary>The integer in the first <paramref name="bytes"/> bytes of <paramref name="cell"/>: 1 (unsigned), 2, 4 or 8 (signed).</summary>
    public static long Integer(ReadOnlySpan<byte> cell, int bytes) => bytes switch
    {
        1 => cell[0],
        2 => BinaryPrimitives.ReadInt16BigEndian(cell),
        4 => BinaryPrimitives.ReadInt32BigEndian(cell),
        _ => BinaryPrimitives.ReadInt64BigEndian(cell),
    };

    /// <summary>The IEEE 754 number in the first <paramref name="bytes"/> bytes of <paramref name="cell"/>: 4 (single) or 8 (double).</summary>
    public static double Real(ReadOnlySpan<byte> cell, int bytes) =>
        bytes == 4 ? BinaryPrimitives.ReadSingleBigEndian(cell) : BinaryPrimitives.ReadDoubleBigEndian(cell);
}

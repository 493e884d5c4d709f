using SizeTest.Foundation.Errors;

namespace SizeTest.Catalogues.Parquet;

/// <summary>
/// Checks a Parquet file's footer before the Parquet library reads it, so that a damaged length can never make it
/// allocate more than the file holds (the fuzz suite found a footer length of 2³¹−1, and Thrift string lengths of
/// 1.5 GB inside the footer, each of which the library tried to allocate, failing as "internal error").
/// </summary>
/// <remarks>
/// Layout (Apache Parquet format specification, "File format"): <c>PAR1</c>, data, the file metadata serialised with
/// the Thrift compact protocol, its length as a 4-byte little-endian integer, <c>PAR1</c>. The metadata is walked
/// as generic compact-protocol values (Apache Thrift, "Thrift Compact protocol encoding": field headers with a
/// delta or zigzag field id, ULEB128 varints, length-prefixed binaries, list/set headers with a 4-bit or varint size,
/// map headers): every binary length and every element count must fit in the bytes that remain, and nesting is
/// limited to <see cref="MaxDepth"/>.
/// </remarks>
public static class ParquetFooterCheck
{
    /// <summary>Deepest struct/list nesting accepted in the metadata (real Parquet metadata nests about 5 deep).</summary>
    public const int MaxDepth = 64;

    /// <summary>Throws <see cref="InputException"/> naming <paramref name="path"/> when the footer of <paramref name="stream"/> is not well formed.</summary>
    public static void Check(Stream stream, string path)
    {
        long fileLength = stream.Length;
        Span<byte> len = stackalloc byte[4];
        stream.Position = fileLength - 8;
        stream.ReadExactly(len);
        long footer = System.Buffers.Binary.BinaryPrimitives.ReadInt32LittleEndian(len);
        if (footer <= 0 || footer > fileLength - 12)
            throw new InputException($"the Parquet footer length {footer} does not fit in the file ({fileLength} bytes); the file is truncated or damaged", path);
        var bytes = new byte[footer];
        stream.Position = fileLength - 8 - footer;
        stream.ReadExactly(bytes);
        int pos = 0;
        if (!SkipStruct(bytes, ref pos, 0))
            throw new InputException($"the Parquet footer ({footer} bytes) is damaged: a length, count or nesting in it does not fit the footer", path);
    }

    private static bool SkipStruct(byte[] b, ref int pos, int depth)
    {
        if (depth > MaxDepth) return false;
        while (true)
        {
            if (pos >= b.Length) return false;
            byte header = b[pos++];
            int type = header & 0x0F;
            if (type == 0) return true; // STOP
            if ((header >> 4) == 0 && !ReadVarint(b, ref pos, out _)) return false; // long-form field id
            if (type is 1 or 2) continue; // boolean true/false live in the field header
            if (!SkipValue(b, ref pos, type, depth)) return false;
        }
    }

    private static bool SkipValue(byte[] b, ref int pos, int type, int depth)
    {
        switch (type)
        {
            case 1: case 2: case 3: // bool in a collection, byte
                return ++pos <= b.Length;
            case 4: case 5: case 6: // i16, i32, i64
                return ReadVarint(b, ref pos, out _);
            case 7: // double
                return (pos += 8) <= b.Length;
            case 8: // binary/string
                return ReadVarint(b, ref pos, out ulong n) && n <= (ulong)(b.Length - pos) && (pos += (int)n) <= b.Length;
            case 9: case 10: // list, set
            {
                if (pos >= b.Length || depth + 1 > MaxDepth) return false;
                byte h = b[pos++];
                ulong size = (ulong)(h >> 4);
                if (size == 15 && !ReadVarint(b, ref pos, out size)) return false;
                if (size > (ulong)(b.Length - pos)) return false; // every element takes at least one byte
                int elem = h & 0x0F;
                for (ulong i = 0; i < size; i++) if (!SkipValue(b, ref pos, elem, depth + 1)) return false;
                return true;
            }
            case 11: // map
            {
                if (!ReadVarint(b, ref pos, out ulong size) || depth + 1 > MaxDepth) return false;
                if (size == 0) return true;
                if (pos >= b.Length || size > (ulong)(b.Length - pos) / 2) return false;
                byte kv = b[pos++];
                for (ulong i = 0; i < size; i++)
                    if (!SkipValue(b, ref pos, kv >> 4, depth + 1) || !SkipValue(b, ref pos, kv & 0x0F, depth + 1)) return false;
                return true;
            }
            case 12:
                return SkipStruct(b, ref pos, depth + 1);
            default:
                return false;
        }
    }

    private static bool ReadVarint(byte[] b, ref int pos, out ulong value)
    {
        value = 0;
        for (int shift = 0; shift < 64; shift += 7)
        {
            if (pos >= b.Length) return false;
            byte x = b[pos++];
            value |= (ulong)(x & 0x7F) << shift;
            if ((x & 0x80) == 0) return true;
        }
        return false;
    }
}

using SizeTest.Foundation.Errors;

namespace SizeTest.Catalogues.VoTable;

/// <summary>
/// A read-only stream over an XML file that refuses a tag (the bytes from <c>&lt;</c> to the next <c>&gt;</c>) longer
/// than a cap. The XML parser holds a whole start tag with its attributes in memory, and more: a FIELD whose name
/// attribute was 300 MB grew the process to 5.3 GB. Text between tags (TD cells, BINARY2 streams) is not limited here;
/// the reader limits cells itself. A <c>&gt;</c> inside an attribute value only shortens the count, so a tag within
/// the cap is never refused.
/// </summary>
internal sealed class TagLengthCappedStream(Stream inner, string path, int maxTagBytes) : Stream
{
    /// <summary>The default cap: 1 MiB, far above any VOTable tag (a FIELD with a long ucd and name is well under 1 KiB).</summary>
    public const int DefaultMaxTagBytes = 1 << 20;

    private bool _inTag;
    private long _tagBytes;
    private long _offset;

    /// <inheritdoc/>
    public override int Read(byte[] buffer, int offset, int count) => Read(buffer.AsSpan(offset, count));

    /// <inheritdoc/>
    public override int Read(Span<byte> buffer)
    {
        int n = inner.Read(buffer);
        var span = buffer[..n];
        while (span.Length > 0)
        {
            if (!_inTag)
            {
                int open = span.IndexOf((byte)'<');
                if (open < 0) break;
                _inTag = true;
                _tagBytes = 0;
                span = span[(open + 1)..];
                continue;
            }
            int close = span.IndexOf((byte)'>');
            _tagBytes += close < 0 ? span.Length : close;
            if (_tagBytes > maxTagBytes)
                throw new InputException($"an XML tag near byte {_offset + n - span.Length} is longer than {maxTagBytes} bytes (a huge name or attribute); is the file damaged?", path);
            if (close < 0) break;
            _inTag = false;
            span = span[(close + 1)..];
        }
        _offset += n;
        return n;
    }

    /// <inheritdoc/>
    public override bool CanRead => true;
    /// <inheritdoc/>
    public override bool CanSeek => false;
    /// <inheritdoc/>
    public override bool CanWrite => false;
    /// <inheritdoc/>
    public override long Length => throw new NotSupportedException();
    /// <inheritdoc/>
    public override long Position { get => _offset; set => throw new NotSupportedException(); }
    /// <inheritdoc/>
    public override void Flush() { }
    /// <inheritdoc/>
    public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();
    /// <inheritdoc/>
    public override void SetLength(long value) => throw new NotSupportedException();
    /// <inheritdoc/>
    public override void Write(byte[] buffer, int offset, int count) => throw new NotSupportedException();

    /// <inheritdoc/>
    protected override void Dispose(bool disposing)
    {
        if (disposing) inner.Dispose();
        base.Dispose(disposing);
    }
}

using SizeTest.Foundation.Errors;

namespace SizeTest.Foundation.Files;

/// <summary>
/// A read-only stream over a text file that refuses a line longer than a cap: as bytes pass through it counts
/// the bytes since the last line feed and throws an <see cref="InputException"/> naming the file and line once
/// a line passes <see cref="MaxLineBytes"/>. Readers above it (StreamReader.ReadLine, a CSV parser) therefore
/// never buffer more than about one cap of text, whatever the file (<c>/dev/zero</c>, a 20 MB line).
/// </summary>
public sealed class LineCappedStream : Stream
{
    /// <summary>Default cap: 1 MiB per line.</summary>
    public const int DefaultMaxLineBytes = 1 << 20;

    private readonly Stream _inner;
    private readonly string _path;
    private long _run;
    private long _line = 1;

    /// <summary>Wraps <paramref name="inner"/> (owned) read from <paramref name="path"/>.</summary>
    public LineCappedStream(Stream inner, string path, int maxLineBytes = DefaultMaxLineBytes)
    {
        _inner = inner;
        _path = path;
        MaxLineBytes = maxLineBytes > 0 ? maxLineBytes : throw new ArgumentOutOfRangeException(nameof(maxLineBytes));
    }

    /// <summary>The cap, bytes.</summary>
    public int MaxLineBytes { get; }

    /// <summary>Opens <paramref name="path"/> for sequential reading behind the cap.</summary>
    public static LineCappedStream Open(string path, int maxLineBytes = DefaultMaxLineBytes) =>
        new(new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16, FileOptions.SequentialScan), path, maxLineBytes);

    /// <inheritdoc />
    public override int Read(byte[] buffer, int offset, int count) => Read(buffer.AsSpan(offset, count));

    /// <inheritdoc />
    public override int Read(Span<byte> buffer)
    {
        int n = _inner.Read(buffer);
        var span = buffer[..n];
        while (!span.IsEmpty)
        {
            int nl = span.IndexOf((byte)'\n');
            if (nl < 0) { _run += span.Length; break; }
            _run += nl;
            Check();
            _run = 0;
            _line++;
            span = span[(nl + 1)..];
        }
        Check();
        return n;
    }

    private void Check()
    {
        if (_run > MaxLineBytes)
            throw SettingProblem.Input($"line {_line} is longer than the {MaxLineBytes} byte limit for a text line (is this a text catalogue? raise the cap with {{max_line_bytes}} if the line is real)", _path);
    }

    /// <inheritdoc />
    public override bool CanRead => true;
    /// <inheritdoc />
    public override bool CanSeek => false;
    /// <inheritdoc />
    public override bool CanWrite => false;
    /// <inheritdoc />
    public override long Length => throw new NotSupportedException();
    /// <inheritdoc />
    public override long Position { get => throw new NotSupportedException(); set => throw new NotSupportedException(); }
    /// <inheritdoc />
    public override void Flush() { }
    /// <inheritdoc />
    public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();
    /// <inheritdoc />
    public override void SetLength(long value) => throw new NotSupportedException();
    /// <inheritdoc />
    public override void Write(byte[] buffer, int offset, int count) => throw new NotSupportedException();

    /// <inheritdoc />
    protected override void Dispose(bool disposing)
    {
        if (disposing) _inner.Dispose();
        base.Dispose(disposing);
    }
}

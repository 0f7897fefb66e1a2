namespace Patchproof.Core.Captures.Reading;

/// <summary>Reads a stream line by line as UTF-8 bytes without holding its text: one reusable buffer.</summary>
/// <remarks>
/// Lines end with LF, CRLF or a lone CR (decided once from the head of the file). A UTF-8 byte-order mark is
/// skipped. <see cref="Head"/> exposes the first bytes before any line is consumed, for dialect sniffing.
/// A line longer than the buffer is an error the caller reports; the buffer is 1 MiB.
/// </remarks>
internal sealed class ByteLineReader
{
    private const int BufferSize = 1 << 20;

    private readonly Stream stream;
    private readonly byte[] buffer = new byte[BufferSize];
    private int start;
    private int end;
    private bool endOfStream;
    private byte terminator = (byte)'\n';

    public ByteLineReader(Stream stream)
    {
        this.stream = stream;
        Fill();
        if (end >= 3 && buffer[0] == 0xEF && buffer[1] == 0xBB && buffer[2] == 0xBF)
        {
            start = 3;
            HadByteOrderMark = true;
        }

        var head = Head;
        if (head.IndexOf((byte)'\n') < 0 && head.IndexOf((byte)'\r') >= 0)
        {
            terminator = (byte)'\r';
        }
    }

    /// <summary>True when the stream began with a UTF-8 byte-order mark.</summary>
    public bool HadByteOrderMark { get; }

    /// <summary>True when the head contains a UTF-16 byte-order mark.</summary>
    public bool LooksUtf16 => end >= 2 && ((buffer[0] == 0xFF && buffer[1] == 0xFE) || (buffer[0] == 0xFE && buffer[1] == 0xFF));

    /// <summary>The 1-based number of the line last returned by <see cref="TryReadLine"/>.</summary>
    public int LineNumber { get; private set; }

    /// <summary>True when the last line read did not fit the buffer.</summary>
    public bool LineTooLong { get; private set; }

    /// <summary>The unconsumed bytes at the start of the stream (up to 1 MiB), before any line is read.</summary>
    public ReadOnlySpan<byte> Head => buffer.AsSpan(start, end - start);

    /// <summary>True when <see cref="Head"/> holds the whole stream.</summary>
    public bool HeadIsWholeStream => endOfStream;

    /// <summary>Reads the next line without its terminator (and without a trailing CR).</summary>
    /// <param name="line">The line's bytes, valid until the next call.</param>
    /// <returns>False at the end of the stream.</returns>
    public bool TryReadLine(out ReadOnlySpan<byte> line)
    {
        while (true)
        {
            var available = buffer.AsSpan(start, end - start);
            var at = available.IndexOf(terminator);
            if (at >= 0)
            {
                line = available[..at];
                start += at + 1;
                return Finish(ref line);
            }

            if (endOfStream)
            {
                if (available.IsEmpty)
                {
                    line = default;
                    return false;
                }

                line = available;
                start = end;
                return Finish(ref line);
            }

            if (start == 0 && end == buffer.Length)
            {
                // The line does not fit: hand back what there is and skip to the next terminator.
                LineTooLong = true;
                line = available;
                start = end;
                LineNumber++;
                return true;
            }

            Fill();
        }
    }

    private bool Finish(ref ReadOnlySpan<byte> line)
    {
        if (!line.IsEmpty && line[^1] == (byte)'\r')
        {
            line = line[..^1];
        }

        LineTooLong = false;
        LineNumber++;
        return true;
    }

    private void Fill()
    {
        if (start > 0)
        {
            Buffer.BlockCopy(buffer, start, buffer, 0, end - start);
            end -= start;
            start = 0;
        }

        while (end < buffer.Length && !endOfStream)
        {
            var read = stream.Read(buffer, end, buffer.Length - end);
            if (read == 0)
            {
                endOfStream = true;
            }

            end += read;
        }
    }
}

namespace Patchproof.Core.Captures.Reading;

/// <summary>Walks the fields of one line of bytes: a single-byte delimiter, or runs of spaces and tabs.</summary>
/// <remarks>
/// A field may be quoted with double quotes (a doubled quote inside stands for one); the delimiter inside
/// quotes is part of the field. With a single-byte delimiter, "a,b," has three fields, the last empty.
/// With whitespace, leading and trailing spaces make no fields. Allocates nothing.
/// </remarks>
internal ref struct FieldCursor
{
    private readonly ReadOnlySpan<byte> line;
    private readonly byte delimiter;
    private readonly bool whitespace;
    private int position;
    private bool done;

    public FieldCursor(ReadOnlySpan<byte> line, byte delimiter, bool whitespace)
    {
        this.line = line;
        this.delimiter = delimiter;
        this.whitespace = whitespace;
        position = 0;
        done = false;
    }

    /// <summary>Moves to the next field.</summary>
    /// <param name="field">The field's bytes, quotes and surrounding spaces included.</param>
    /// <param name="column">The 1-based byte column where the field starts.</param>
    public bool TryNext(out ReadOnlySpan<byte> field, out int column)
    {
        if (whitespace)
        {
            while (position < line.Length && (line[position] == (byte)' ' || line[position] == (byte)'\t'))
            {
                position++;
            }

            if (position >= line.Length)
            {
                field = default;
                column = line.Length + 1;
                return false;
            }
        }
        else if (done)
        {
            field = default;
            column = line.Length + 1;
            return false;
        }

        var fieldStart = position;
        column = fieldStart + 1;
        var scan = position;
        while (scan < line.Length && (line[scan] == (byte)' ' || line[scan] == (byte)'\t') && !(whitespace || line[scan] == delimiter))
        {
            scan++;
        }

        if (scan < line.Length && line[scan] == (byte)'"')
        {
            scan++;
            while (scan < line.Length)
            {
                if (line[scan] == (byte)'"')
                {
                    if (scan + 1 < line.Length && line[scan + 1] == (byte)'"')
                    {
                        scan += 2;
                        continue;
                    }

                    scan++;
                    break;
                }

                scan++;
            }
        }

        int fieldEnd;
        if (whitespace)
        {
            while (scan < line.Length && line[scan] != (byte)' ' && line[scan] != (byte)'\t')
            {
                scan++;
            }

            fieldEnd = scan;
            position = scan;
        }
        else
        {
            var rest = line[scan..];
            var at = rest.IndexOf(delimiter);
            if (at < 0)
            {
                fieldEnd = line.Length;
                position = line.Length;
                done = true;
            }
            else
            {
                fieldEnd = scan + at;
                position = fieldEnd + 1;
            }
        }

        field = line[fieldStart..fieldEnd];
        return true;
    }
}

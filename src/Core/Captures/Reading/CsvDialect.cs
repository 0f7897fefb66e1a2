namespace Patchproof.Core.Captures.Reading;

/// <summary>One line of the head of a file, kept as text for metadata and header parsing.</summary>
/// <param name="Number">The 1-based line number.</param>
/// <param name="Text">The line decoded as UTF-8 (or Latin-1 when it is not valid UTF-8).</param>
internal sealed record HeadLine(int Number, string Text);

/// <summary>What the sniffer worked out about a file's layout.</summary>
/// <param name="Delimiter">The field delimiter byte (',' ';' or tab); a space means runs of spaces and tabs.</param>
/// <param name="DecimalSeparator">'.' or ','.</param>
/// <param name="FieldCount">Number of data fields per row, trailing empty fields not counted.</param>
/// <param name="DataStartLine">The 1-based line of the first data row.</param>
/// <param name="Header">The header line, or null when the file has none.</param>
/// <param name="UnitsRow">A separate row of units under the header, or null.</param>
/// <param name="MetadataLines">The lines before the header (or before the data when there is no header).</param>
/// <param name="FirstRows">Up to 20 complete rows of numbers from the start of the data, for deciding column roles.</param>
internal sealed record CsvDialect(
    byte Delimiter,
    byte DecimalSeparator,
    int FieldCount,
    int DataStartLine,
    HeadLine? Header,
    HeadLine? UnitsRow,
    IReadOnlyList<HeadLine> MetadataLines,
    IReadOnlyList<double[]> FirstRows)
{
    /// <summary>True when fields are separated by runs of spaces and tabs.</summary>
    public bool IsWhitespaceDelimited => Delimiter == (byte)' ';

    /// <summary>A readable name for the delimiter, for notes.</summary>
    public string DelimiterName => Delimiter switch
    {
        (byte)',' => "comma",
        (byte)';' => "semicolon",
        (byte)'\t' => "tab",
        _ => "spaces",
    };
}

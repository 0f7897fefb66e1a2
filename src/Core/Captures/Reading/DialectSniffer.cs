using System.Globalization;
using System.Text;
using CsvHelper;

namespace Patchproof.Core.Captures.Reading;

/// <summary>Works out a file's dialect from its head: delimiter, decimal separator, metadata, header, units row.</summary>
/// <remarks>
/// Each candidate (comma, semicolon, tab, runs of spaces; decimal point, or decimal comma where the
/// delimiter is not a comma) is scored on the head's lines: the first run of three rows made only of
/// numbers with one field count (two of the five rows after it agreeing) marks the data. Candidates are ranked by whether the nearest line above
/// the data splits into the same number of fields (a header), by how many of the following rows keep
/// that shape, by the number of fields, then in the order listed. Metadata and header lines are split
/// with CsvHelper so quoted names work.
/// </remarks>
internal static class DialectSniffer
{
    /// <summary>How many lines of the head are examined.</summary>
    public const int MaxHeadLines = 400;

    private static readonly byte[] Delimiters = [(byte)',', (byte)';', (byte)'\t', (byte)' '];

    /// <summary>Sniffs the dialect, or returns the error that makes the file unreadable.</summary>
    public static ParseResult<CsvDialect> Sniff(ReadOnlySpan<byte> head, bool headIsWholeFile, string? file)
    {
        var lines = SplitHead(head, headIsWholeFile);
        if (lines.Count == 0 || lines.All(l => NumberParser.Trim(l.Bytes).IsEmpty))
        {
            return ParseResult<CsvDialect>.ForError(SourceDiagnostic.ErrorAt(file, 1, 0, "The file is empty: it holds no header and no rows of numbers."));
        }

        var binary = FindBinaryByte(lines);
        if (binary is { } at)
        {
            return ParseResult<CsvDialect>.ForError(SourceDiagnostic.ErrorAt(file, at.Line, at.Column,
                $"This is not a text file: byte 0x{at.Value:X2} is a control character no CSV export contains."));
        }

        Candidate? best = null;
        foreach (var delimiter in Delimiters)
        {
            foreach (var separator in delimiter == (byte)',' ? new[] { (byte)'.' } : [(byte)'.', (byte)','])
            {
                var candidate = Evaluate(lines, delimiter, separator);
                if (candidate is not null && (best is null || candidate.IsBetterThan(best)))
                {
                    best = candidate;
                }
            }
        }

        if (best is null)
        {
            var firstText = lines.First(l => !NumberParser.Trim(l.Bytes).IsEmpty);
            return ParseResult<CsvDialect>.ForError(SourceDiagnostic.ErrorAt(file, firstText.Number, 0,
                $"No rows of numbers found in the first {lines.Count} lines: a capture needs rows of numbers under an optional header."));
        }

        return ParseResult<CsvDialect>.ForValue(BuildDialect(lines, best));
    }

    /// <summary>Splits a line of the head into trimmed fields with CsvHelper (or on runs of spaces).</summary>
    public static IReadOnlyList<string> SplitText(string text, byte delimiter)
    {
        if (delimiter == (byte)' ')
        {
            // "CH1 (V)  CH2 (V)": a bracketed unit belongs to the name before it.
            var tokens = new List<string>();
            foreach (var token in text.Split([' ', '\t'], StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
            {
                if (tokens.Count > 0 && token[0] is '(' or '[' or '{')
                {
                    tokens[^1] += " " + token;
                }
                else
                {
                    tokens.Add(token.Trim('"'));
                }
            }

            return tokens;
        }

        var options = new CsvReaderOptions
        {
            Separator = (char)delimiter,
            HasHeader = false,
            TrimWhitespace = true,
            AllowLineBreaksInQuotes = false,
            SkipEmptyLines = false,
            MalformedData = CsvMalformedDataHandling.Recover,
        };
        using var reader = CsvReader.FromText(text, options);
        return reader.Read() ? reader.Current.ToArray().Select(f => f.Trim()).ToArray() : [text.Trim()];
    }

    /// <summary>Drops empty fields at the end of a row (a trailing delimiter).</summary>
    public static IReadOnlyList<string> WithoutTrailingEmpty(IReadOnlyList<string> fields)
    {
        var count = fields.Count;
        while (count > 0 && fields[count - 1].Length == 0)
        {
            count--;
        }

        return count == fields.Count ? fields : fields.Take(count).ToArray();
    }

    private static Candidate? Evaluate(List<RawLine> lines, byte delimiter, byte separator)
    {
        var shapes = new int[lines.Count];
        for (var i = 0; i < lines.Count; i++)
        {
            shapes[i] = DataShape(lines[i].Bytes, delimiter, separator);
        }

        for (var i = 0; i < lines.Count; i++)
        {
            if (shapes[i] <= 0)
            {
                continue;
            }

            var n = shapes[i];
            var following = 0;
            var agreeing = 0;
            var nearFollowing = 0;
            var confirmed = 0;
            for (var j = i + 1; j < lines.Count; j++)
            {
                if (NumberParser.Trim(lines[j].Bytes).IsEmpty)
                {
                    continue;
                }

                following++;
                var near = nearFollowing < 5;
                if (near)
                {
                    nearFollowing++;
                }

                if (shapes[j] == n)
                {
                    agreeing++;
                    if (near)
                    {
                        confirmed++;
                    }
                }
            }

            // Two of the next five rows must keep the shape; ragged rows are the body reader's business.
            if (confirmed < Math.Min(2, nearFollowing))
            {
                continue;
            }

            var coverage = following == 0 ? 1.0 : (double)agreeing / following;
            var above = NearestTextLineAbove(lines, i);
            var headerAgrees = above is not null && TextFieldCount(above, delimiter) == n && !HasNumberLikeField(above, delimiter, separator);
            return new Candidate(delimiter, separator, i, n, coverage, headerAgrees, Array.IndexOf(Delimiters, delimiter) * 2 + (separator == (byte)'.' ? 0 : 1));
        }

        return null;
    }

    private static CsvDialect BuildDialect(List<RawLine> lines, Candidate best)
    {
        var dataIndex = best.DataIndex;

        // A damaged first row (text or a wrong decimal in a number) above the rows found: start the data there,
        // so that the body reader reports it at its line and column instead of taking it for metadata.
        var above = NearestTextIndexAbove(lines, dataIndex);
        while (above >= 0 && LineKind(lines[above], best) == Kind.DamagedRow)
        {
            dataIndex = above;
            above = NearestTextIndexAbove(lines, dataIndex);
        }

        HeadLine? header = null;
        HeadLine? units = null;
        var metadataEnd = dataIndex;
        if (above >= 0 && LineKind(lines[above], best) == Kind.Names)
        {
            var aboveLine = lines[above].ToHeadLine();
            header = aboveLine;
            metadataEnd = above;
            if (IsUnitsRow(aboveLine, best.Delimiter))
            {
                var second = NearestTextIndexAbove(lines, above);
                if (second >= 0 && LineKind(lines[second], best) == Kind.Names && !IsUnitsRow(lines[second].ToHeadLine(), best.Delimiter))
                {
                    units = aboveLine;
                    header = lines[second].ToHeadLine();
                    metadataEnd = second;
                }
            }
        }

        var metadata = lines.Take(metadataEnd)
            .Where(l => !NumberParser.Trim(l.Bytes).IsEmpty)
            .Select(l => l.ToHeadLine())
            .ToArray();
        var firstRows = new List<double[]>();
        for (var i = dataIndex; i < lines.Count && firstRows.Count < 20; i++)
        {
            if (TryParseRow(lines[i].Bytes, best) is { } row)
            {
                firstRows.Add(row);
            }
        }

        return new CsvDialect(best.Delimiter, best.Separator, best.FieldCount, lines[dataIndex].Number, header, units, metadata, firstRows);
    }

    private static double[]? TryParseRow(ReadOnlySpan<byte> line, Candidate best)
    {
        var cursor = new FieldCursor(line, best.Delimiter, best.Delimiter == (byte)' ');
        var row = new double[best.FieldCount];
        var k = 0;
        while (cursor.TryNext(out var field, out _))
        {
            if (k < row.Length)
            {
                if (NumberParser.Parse(field, best.Separator, out row[k], out _) != FieldStatus.Number)
                {
                    return null;
                }
            }
            else if (!NumberParser.Trim(field).IsEmpty)
            {
                return null;
            }

            k++;
        }

        return k >= row.Length ? row : null;
    }

    private enum Kind
    {
        Other,
        Names,
        DamagedRow,
    }

    private static Kind LineKind(RawLine line, Candidate best)
    {
        var text = line.ToHeadLine().Text.Trim();
        if (text.StartsWith('#') || text.StartsWith("//", StringComparison.Ordinal) || (text.StartsWith('[') && text.EndsWith(']')) || IsSeparatorLine(text))
        {
            return Kind.Other;
        }

        var fields = WithoutTrailingEmpty(SplitText(line.ToHeadLine().Text, best.Delimiter));
        if (fields.Count != best.FieldCount)
        {
            return Kind.Other;
        }

        // A header holds names only; a row whose first field or most fields are numbers is a damaged data row;
        // anything else of the right width ("Sample interval,2e-6") is metadata.
        var numeric = fields.Select(f => IsNumberLike(f, best.Separator)).ToArray();
        var numbers = numeric.Count(n => n);
        if (numbers == 0)
        {
            return Kind.Names;
        }

        return numeric[0] || numbers * 2 > fields.Count ? Kind.DamagedRow : Kind.Other;
    }

    private static bool IsNumberLike(string field, byte separator)
    {
        var status = NumberParser.Parse(Encoding.UTF8.GetBytes(field), separator, out _, out _);
        return status is FieldStatus.Number or FieldStatus.NonFinite or FieldStatus.OtherDecimalSeparator;
    }

    private static bool IsUnitsRow(HeadLine line, byte delimiter)
    {
        var fields = WithoutTrailingEmpty(SplitText(line.Text, delimiter));
        var known = 0;
        foreach (var field in fields)
        {
            if (field.Length == 0)
            {
                continue;
            }

            if (!Units.IsKnownUnit(field))
            {
                return false;
            }

            known++;
        }

        return known > 0;
    }

    /// <summary>True for a line of dashes, equals signs, stars or underscores.</summary>
    public static bool IsSeparatorLine(string text)
    {
        var t = text.Trim().Trim(',', ';', '\t', ' ');
        return t.Length >= 3 && t.All(c => c is '-' or '=' or '*' or '_' or '~');
    }

    private static RawLine? NearestTextLineAbove(List<RawLine> lines, int index)
    {
        var at = NearestTextIndexAbove(lines, index);
        return at >= 0 ? lines[at] : null;
    }

    private static int NearestTextIndexAbove(List<RawLine> lines, int index)
    {
        for (var i = index - 1; i >= 0; i--)
        {
            if (!NumberParser.Trim(lines[i].Bytes).IsEmpty)
            {
                return i;
            }
        }

        return -1;
    }

    private static bool HasNumberLikeField(RawLine line, byte delimiter, byte separator) =>
        SplitText(line.ToHeadLine().Text, delimiter).Any(f => f.Length > 0 && IsNumberLike(f, separator));

    private static int TextFieldCount(RawLine line, byte delimiter) =>
        WithoutTrailingEmpty(SplitText(line.ToHeadLine().Text, delimiter)).Count;

    /// <summary>The number of fields when the line is a row of numbers (empty and non-finite fields allowed, most fields numbers); else 0.</summary>
    private static int DataShape(ReadOnlySpan<byte> line, byte delimiter, byte separator)
    {
        var cursor = new FieldCursor(line, delimiter, delimiter == (byte)' ');
        var count = 0;
        var numbers = 0;
        var lastNonEmpty = 0;
        while (cursor.TryNext(out var field, out _))
        {
            count++;
            switch (NumberParser.Parse(field, separator, out _, out _))
            {
                case FieldStatus.Number:
                    numbers++;
                    lastNonEmpty = count;
                    break;
                case FieldStatus.NonFinite:
                    lastNonEmpty = count;
                    break;
                case FieldStatus.Empty:
                    break;
                default:
                    return 0;
            }
        }

        return numbers > 0 && numbers * 2 >= lastNonEmpty ? lastNonEmpty : 0;
    }

    private static List<RawLine> SplitHead(ReadOnlySpan<byte> head, bool headIsWholeFile)
    {
        var lines = new List<RawLine>();
        var terminator = head.IndexOf((byte)'\n') < 0 && head.IndexOf((byte)'\r') >= 0 ? (byte)'\r' : (byte)'\n';
        var number = 0;
        while (!head.IsEmpty && lines.Count < MaxHeadLines)
        {
            var at = head.IndexOf(terminator);
            if (at < 0 && !headIsWholeFile)
            {
                break;
            }

            var line = at < 0 ? head : head[..at];
            head = at < 0 ? [] : head[(at + 1)..];
            if (!line.IsEmpty && line[^1] == (byte)'\r')
            {
                line = line[..^1];
            }

            number++;
            lines.Add(new RawLine(number, line.ToArray()));
        }

        return lines;
    }

    private static (int Line, int Column, byte Value)? FindBinaryByte(List<RawLine> lines)
    {
        foreach (var line in lines)
        {
            for (var i = 0; i < line.Bytes.Length; i++)
            {
                var b = line.Bytes[i];
                if (b < 0x20 && b != (byte)'\t' && b != (byte)'\r' && b != (byte)'\f' && b != 0x1A)
                {
                    return (line.Number, i + 1, b);
                }
            }
        }

        return null;
    }

    private sealed record RawLine(int Number, byte[] Bytes)
    {
        public HeadLine ToHeadLine() => new(Number, Decode(Bytes));

        private static string Decode(byte[] bytes)
        {
            try
            {
                return new UTF8Encoding(false, true).GetString(bytes);
            }
            catch (DecoderFallbackException)
            {
                return Encoding.Latin1.GetString(bytes);
            }
        }
    }

    private sealed record Candidate(byte Delimiter, byte Separator, int DataIndex, int FieldCount, double Coverage, bool HeaderAgrees, int Priority)
    {
        public bool IsBetterThan(Candidate other)
        {
            if (HeaderAgrees != other.HeaderAgrees)
            {
                return HeaderAgrees;
            }

            var coverageBucket = Math.Round(Coverage * 20);
            var otherBucket = Math.Round(other.Coverage * 20);
            if (coverageBucket != otherBucket)
            {
                return coverageBucket > otherBucket;
            }

            if (FieldCount != other.FieldCount)
            {
                return FieldCount > other.FieldCount;
            }

            return Priority < other.Priority;
        }
    }
}

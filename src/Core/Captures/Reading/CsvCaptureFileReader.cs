using System.Globalization;

namespace Patchproof.Core.Captures.Reading;

/// <summary>Reads one CSV file into a <see cref="RawCapture"/>: sniffs the dialect, then streams the numeric body.</summary>
/// <remarks>
/// The body is read line by line from a 1 MiB buffer; fields are parsed from the bytes in place
/// (<see cref="NumberParser"/>), so no text is held and nothing is allocated per row. Channels go to
/// float32 buffers sized from the file length, the time column to a double buffer.
/// Recoveries: rows with an empty or missing field, or NaN/Inf, are skipped with a warning naming their
/// lines when the file has a time column (without one, skipping would shift every later sample, so it is
/// an error). Errors: text in a number, the other decimal separator, more fields than the header, time
/// that runs backwards, a line over 1 MiB.
/// </remarks>
internal sealed class CsvCaptureFileReader
{
    private const int MaxReportedRanges = 5;

    private readonly string? file;
    private readonly List<SourceDiagnostic> notes = [];

    private CsvCaptureFileReader(string? file) => this.file = file;

    /// <summary>Reads a stream of CSV text (UTF-8 or ASCII, with or without a byte-order mark).</summary>
    /// <param name="stream">The content, read once from its current position.</param>
    /// <param name="file">The file name for messages, or null.</param>
    /// <param name="lengthHint">The length in bytes when known (sizes the buffers), or -1.</param>
    public static ParseResult<RawCapture> Read(Stream stream, string? file, long lengthHint) =>
        new CsvCaptureFileReader(file).ReadCore(stream, lengthHint);

    private ParseResult<RawCapture> ReadCore(Stream stream, long lengthHint)
    {
        var lines = new ByteLineReader(stream);
        if (lines.LooksUtf16)
        {
            return Fail(SourceDiagnostic.ErrorAt(file, 1, 1, "The file is UTF-16 text; save or export it as UTF-8 or ASCII."));
        }

        var sniffed = DialectSniffer.Sniff(lines.Head, lines.HeadIsWholeStream, file);
        if (!sniffed.TryGetValue(out var dialect))
        {
            return ParseResult<RawCapture>.ForErrors(sniffed.Errors);
        }

        var metadata = MetadataParser.Parse(dialect.MetadataLines, dialect.Delimiter, file);
        var interval = MetadataParser.FindInterval(metadata, dialect.DecimalSeparator);
        var columns = DescribeColumns(dialect, interval is not null);
        if (!columns.TryGetValue(out var layout))
        {
            return ParseResult<RawCapture>.ForErrors(columns.Errors, notes);
        }

        Note(dialect.DataStartLine, DescribeDialect(dialect, lines.HadByteOrderMark));
        var body = ReadBody(lines, dialect, layout, lengthHint);
        if (!body.TryGetValue(out var columnsRead))
        {
            return ParseResult<RawCapture>.ForErrors(body.Errors, notes);
        }

        var timeBase = TimeBaseBuilder.Build(columnsRead.Times, columnsRead.TimeQuantumExponent, layout.TimeSecondsPerUnit, interval, MetadataParser.FindStart(metadata, dialect.DecimalSeparator), columnsRead.RowCount, columnsRead.FirstDataLine, file, notes);
        if (!timeBase.TryGetValue(out var time))
        {
            return ParseResult<RawCapture>.ForErrors(timeBase.Errors, notes);
        }

        var channels = new List<RawChannel>();
        for (var k = 0; k < layout.Channels.Count; k++)
        {
            var c = layout.Channels[k];
            channels.Add(new RawChannel(c.Name, c.Unit, columnsRead.Channels[k].ToMemory(), file, c.Column, c.UnitLine));
        }

        return ParseResult<RawCapture>.ForValue(new RawCapture(file, time, channels, metadata, notes), notes);
    }

    private ParseResult<ColumnLayout> DescribeColumns(CsvDialect dialect, bool metadataHasInterval)
    {
        var n = dialect.FieldCount;
        var headers = new ColumnHeader[n];
        if (dialect.Header is { } header)
        {
            var names = DialectSniffer.WithoutTrailingEmpty(DialectSniffer.SplitText(header.Text, dialect.Delimiter));
            var unitsRow = dialect.UnitsRow is { } u ? DialectSniffer.SplitText(u.Text, dialect.Delimiter) : null;
            for (var k = 0; k < n; k++)
            {
                var parsed = ColumnHeader.Parse(k < names.Count ? names[k] : string.Empty);
                if (unitsRow is not null && k < unitsRow.Count && unitsRow[k].Length > 0)
                {
                    parsed = parsed with { Unit = Units.StripBrackets(unitsRow[k]) };
                }

                headers[k] = parsed.Name.Length == 0 ? parsed with { Name = $"CH{k + 1}" } : parsed;
            }
        }
        else
        {
            var firstIsIndex = n >= 2 && IsCountingColumn(dialect.FirstRows, 0);
            for (var k = 0; k < n; k++)
            {
                headers[k] = new ColumnHeader($"CH{k + 1}", null);
            }

            if (firstIsIndex)
            {
                headers[0] = new ColumnHeader("index", null);
            }
            else if (!metadataHasInterval && n >= 2)
            {
                headers[0] = new ColumnHeader("time", null);
                Note(dialect.DataStartLine, "The file has no header: the first column is taken as time in seconds and the others as channels CH1, CH2...", DiagnosticSeverity.Warning);
                for (var k = 1; k < n; k++)
                {
                    headers[k] = new ColumnHeader($"CH{k}", null);
                }
            }
        }

        var timeColumn = -1;
        var channels = new List<ColumnSpec>();
        var roles = new ColumnRole[n];
        var unitLine = dialect.UnitsRow?.Number ?? dialect.Header?.Number ?? 0;
        for (var k = 0; k < n; k++)
        {
            var role = headers[k].Role;
            if (role == ColumnRole.Time && timeColumn >= 0)
            {
                role = ColumnRole.Channel;
            }

            if (role == ColumnRole.SampleIndex && (k != 0 || !IsCountingColumn(dialect.FirstRows, k)))
            {
                role = ColumnRole.Channel;
            }

            roles[k] = role;
            switch (role)
            {
                case ColumnRole.Time:
                    timeColumn = k;
                    break;
                case ColumnRole.SampleIndex:
                    Note(dialect.Header?.Number ?? dialect.DataStartLine, $"Column {k + 1} ('{headers[k].Name}') counts samples; it is not read as a channel.");
                    break;
                default:
                    channels.Add(new ColumnSpec(headers[k].Name, string.IsNullOrWhiteSpace(headers[k].Unit) ? null : headers[k].Unit, k + 1, unitLine));
                    break;
            }
        }

        double timeFactor = 1;
        if (timeColumn >= 0)
        {
            var unit = headers[timeColumn].Unit;
            if (string.IsNullOrWhiteSpace(unit))
            {
                Note(unitLine == 0 ? dialect.DataStartLine : unitLine, $"The time column '{headers[timeColumn].Name}' gives no unit: taken as seconds.");
            }
            else if (Units.SecondsPer(unit) is { } f)
            {
                timeFactor = f;
            }
            else
            {
                return ParseResult<ColumnLayout>.ForError(SourceDiagnostic.ErrorAt(file, unitLine, 0,
                    $"The time column '{headers[timeColumn].Name}' is in '{unit}', which is not a time unit (s, ms, us, ns)."));
            }
        }
        else if (!metadataHasInterval)
        {
            var where = dialect.Header?.Number ?? dialect.DataStartLine;
            var what = n == 1 ? "The file has a single column and no time column" : "The file has no time column";
            return ParseResult<ColumnLayout>.ForError(SourceDiagnostic.ErrorAt(file, where, 0,
                $"{what}, and its metadata gives no sample interval or rate; add a time column or a line such as 'Sample interval: 2 us'."));
        }

        if (channels.Count == 0)
        {
            return ParseResult<ColumnLayout>.ForError(SourceDiagnostic.ErrorAt(file, dialect.Header?.Number ?? dialect.DataStartLine, 0,
                "The file has a time column but no channel: a capture needs at least one recorded signal."));
        }

        return ParseResult<ColumnLayout>.ForValue(new ColumnLayout(roles, timeColumn, timeFactor, channels));
    }

    private ParseResult<BodyColumns> ReadBody(ByteLineReader lines, CsvDialect dialect, ColumnLayout layout, long lengthHint)
    {
        var n = dialect.FieldCount;
        var estimate = EstimateRows(lines.Head, lengthHint);
        var channelBuffers = new GrowableBuffer<float>[layout.Channels.Count];
        for (var k = 0; k < channelBuffers.Length; k++)
        {
            channelBuffers[k] = new GrowableBuffer<float>(estimate);
        }

        var times = layout.TimeColumn >= 0 ? new GrowableBuffer<double>(estimate) : null;
        var slot = new int[n];
        var channelIndex = 0;
        for (var k = 0; k < n; k++)
        {
            slot[k] = layout.Roles[k] switch
            {
                ColumnRole.Time => -1,
                ColumnRole.SampleIndex => -2,
                _ => channelIndex++,
            };
        }

        var row = new double[n];
        var delimiter = dialect.Delimiter;
        var whitespace = dialect.IsWhitespaceDelimited;
        var separator = dialect.DecimalSeparator;
        var timeColumn = layout.TimeColumn;
        var previousTime = double.NegativeInfinity;
        var previousTimeLine = 0;
        var quantumExponent = int.MinValue;
        var missing = new LineRanges();
        var nonFinite = new LineRanges();
        var comments = 0;
        var firstDataLine = 0;
        var fastPathPossible = !whitespace;

        // Appends a parsed row; false when its time runs backwards.
        bool Append(double[] values, int lineNumber, ref int first)
        {
            if (timeColumn >= 0)
            {
                var t = values[timeColumn];
                if (t < previousTime)
                {
                    return false;
                }

                previousTime = t;
                previousTimeLine = lineNumber;
                times!.Add(t);
            }

            for (var c = 0; c < values.Length; c++)
            {
                var s = slot[c];
                if (s >= 0)
                {
                    channelBuffers[s].Add((float)values[c]);
                }
            }

            if (first == 0)
            {
                first = lineNumber;
            }

            return true;
        }

        while (lines.TryReadLine(out var line))
        {
            var lineNumber = lines.LineNumber;
            if (lineNumber < dialect.DataStartLine)
            {
                continue;
            }

            if (lines.LineTooLong)
            {
                return Fail<BodyColumns>(lineNumber, 0, "This line is longer than 1 MiB; it is not a row of a capture.");
            }

            var trimmed = NumberParser.Trim(line);
            if (trimmed.IsEmpty)
            {
                continue;
            }

            if (trimmed[0] == (byte)'#')
            {
                comments++;
                continue;
            }

            if (fastPathPossible && FastRowParser.TryParse(line, delimiter, separator, row, timeColumn, ref quantumExponent))
            {
                if (!Append(row, lineNumber, ref firstDataLine))
                {
                    return Fail<BodyColumns>(lineNumber, FieldColumn(line, dialect, timeColumn),
                        $"Time runs backwards: {Format(row[timeColumn])} here after {Format(previousTime)} at line {previousTimeLine}; the rows must be in time order.");
                }

                continue;
            }

            var cursor = new FieldCursor(line, delimiter, whitespace);
            var k = 0;
            var rowMissing = 0;
            var rowNonFinite = 0;
            while (cursor.TryNext(out var field, out var column))
            {
                if (k >= n)
                {
                    if (!NumberParser.Trim(field).IsEmpty)
                    {
                        return Fail<BodyColumns>(lineNumber, column, $"This row has more fields than the {n} columns of the data; the extra field is '{Text(field)}'.");
                    }

                    k++;
                    continue;
                }

                var status = NumberParser.Parse(field, separator, out var value, out var lastDigit);
                switch (status)
                {
                    case FieldStatus.Number:
                        row[k] = value;
                        if (k == timeColumn && lastDigit > quantumExponent)
                        {
                            quantumExponent = lastDigit;
                        }

                        break;
                    case FieldStatus.Empty:
                        rowMissing = rowMissing == 0 ? column : rowMissing;
                        break;
                    case FieldStatus.NonFinite:
                        rowNonFinite = rowNonFinite == 0 ? column : rowNonFinite;
                        break;
                    case FieldStatus.OtherDecimalSeparator:
                        return Fail<BodyColumns>(lineNumber, column, $"'{Text(field)}' is written with a decimal {(separator == (byte)'.' ? "comma" : "point")}, but this file uses a decimal {(separator == (byte)'.' ? "point" : "comma")}: mixed decimal styles.");
                    default:
                        return Fail<BodyColumns>(lineNumber, column, $"'{Text(field)}' in column {k + 1} is not a number.");
                }

                k++;
            }

            if (k < n)
            {
                rowMissing = rowMissing == 0 ? line.Length + 1 : rowMissing;
            }

            if (rowMissing != 0 || rowNonFinite != 0)
            {
                if (timeColumn < 0)
                {
                    var what = rowMissing != 0 ? "A value is missing" : "A value is NaN or infinite";
                    return Fail<BodyColumns>(lineNumber, rowMissing != 0 ? rowMissing : rowNonFinite,
                        $"{what} in this row; without a time column, skipping the row would shift every later sample.");
                }

                (rowMissing != 0 ? missing : nonFinite).Add(lineNumber);
                continue;
            }

            if (!Append(row, lineNumber, ref firstDataLine))
            {
                return Fail<BodyColumns>(lineNumber, FieldColumn(line, dialect, timeColumn),
                    $"Time runs backwards: {Format(row[timeColumn])} here after {Format(previousTime)} at line {previousTimeLine}; the rows must be in time order.");
            }
        }

        var rows = channelBuffers[0].Count;
        if (rows == 0)
        {
            return Fail<BodyColumns>(dialect.DataStartLine, 0, "No complete row of numbers could be read from the data.");
        }

        missing.Report(this, "skipped {0} with missing values at {1}");
        nonFinite.Report(this, "skipped {0} with NaN or infinite values at {1}");
        if (comments > 0)
        {
            Note(dialect.DataStartLine, $"Skipped {comments} comment line{(comments == 1 ? string.Empty : "s")} among the data.");
        }

        return ParseResult<BodyColumns>.ForValue(new BodyColumns(rows, times?.ToMemory(), quantumExponent, channelBuffers, firstDataLine));
    }

    private static int FieldColumn(ReadOnlySpan<byte> line, CsvDialect dialect, int index)
    {
        var cursor = new FieldCursor(line, dialect.Delimiter, dialect.IsWhitespaceDelimited);
        for (var k = 0; cursor.TryNext(out _, out var column); k++)
        {
            if (k == index)
            {
                return column;
            }
        }

        return 0;
    }

    private static bool IsCountingColumn(IReadOnlyList<double[]> rows, int k)
    {
        if (rows.Count < 2)
        {
            return false;
        }

        for (var i = 0; i < rows.Count; i++)
        {
            if (rows[i][k] != rows[0][k] + i || rows[i][k] != Math.Floor(rows[i][k]))
            {
                return false;
            }
        }

        return true;
    }

    private static int EstimateRows(ReadOnlySpan<byte> head, long lengthHint)
    {
        if (lengthHint <= 0)
        {
            return 1 << 16;
        }

        // Average row length from the head's data rows, with 2 % spare.
        var lineCount = head.Count((byte)'\n');
        var averageLine = lineCount > 0 ? Math.Max(4.0, (double)head.Length / lineCount) : 64.0;
        var rows = (lengthHint / averageLine * 1.02) + 64;
        return (int)Math.Min(rows, Array.MaxLength);
    }

    private static string DescribeDialect(CsvDialect dialect, bool byteOrderMark)
    {
        var parts = new List<string>
        {
            $"{dialect.DelimiterName} delimited",
            dialect.DecimalSeparator == (byte)',' ? "decimal comma" : "decimal point",
        };
        if (dialect.MetadataLines.Count > 0)
        {
            parts.Add($"{dialect.MetadataLines.Count} metadata line{(dialect.MetadataLines.Count == 1 ? string.Empty : "s")}");
        }

        parts.Add(dialect.Header is { } h ? $"header at line {h.Number}" : "no header");
        if (dialect.UnitsRow is { } u)
        {
            parts.Add($"units row at line {u.Number}");
        }

        parts.Add($"data from line {dialect.DataStartLine}, {dialect.FieldCount} column{(dialect.FieldCount == 1 ? string.Empty : "s")}");
        if (byteOrderMark)
        {
            parts.Add("UTF-8 byte-order mark");
        }

        return "Read as " + string.Join(", ", parts) + ".";
    }

    private static string Text(ReadOnlySpan<byte> field)
    {
        var trimmed = NumberParser.Trim(field);
        var text = System.Text.Encoding.UTF8.GetString(trimmed.Length > 40 ? trimmed[..40] : trimmed);
        return trimmed.Length > 40 ? text + "..." : text;
    }

    private static string Format(double value) => value.ToString("G9", CultureInfo.InvariantCulture);

    private void Note(int line, string message, DiagnosticSeverity severity = DiagnosticSeverity.Info) =>
        notes.Add(new SourceDiagnostic(severity, file, line, 0, message));

    private ParseResult<RawCapture> Fail(SourceDiagnostic error) => ParseResult<RawCapture>.ForErrors([error], notes);

    private ParseResult<T> Fail<T>(int line, int column, string message) =>
        ParseResult<T>.ForErrors([SourceDiagnostic.ErrorAt(file, line, column, message)], notes);

    private sealed record ColumnSpec(string Name, string? Unit, int Column, int UnitLine);

    private sealed record ColumnLayout(ColumnRole[] Roles, int TimeColumn, double TimeSecondsPerUnit, IReadOnlyList<ColumnSpec> Channels);

    private sealed record BodyColumns(int RowCount, Memory<double>? Times, int TimeQuantumExponent, GrowableBuffer<float>[] Channels, int FirstDataLine);

    /// <summary>Line numbers gathered into runs, for "at lines 1203-1205, 2210" messages.</summary>
    private sealed class LineRanges
    {
        private readonly List<(int First, int Last)> ranges = [];

        public int Count { get; private set; }

        public void Add(int line)
        {
            Count++;
            if (ranges.Count > 0 && ranges[^1].Last == line - 1)
            {
                ranges[^1] = (ranges[^1].First, line);
            }
            else if (ranges.Count <= MaxReportedRanges)
            {
                ranges.Add((line, line));
            }
        }

        public void Report(CsvCaptureFileReader reader, string template)
        {
            if (Count == 0)
            {
                return;
            }

            var shown = ranges.Take(MaxReportedRanges).Select(r => r.First == r.Last ? r.First.ToString(CultureInfo.InvariantCulture) : $"{r.First}-{r.Last}");
            var where = (ranges.Count == 1 && ranges[0].First == ranges[0].Last ? "line " : "lines ") + string.Join(", ", shown) + (ranges.Count > MaxReportedRanges ? " and more" : string.Empty);
            var rows = Count == 1 ? "1 row" : $"{Count} rows";
            var message = string.Format(CultureInfo.InvariantCulture, template, rows, where);
            reader.Note(ranges[0].First, char.ToUpperInvariant(message[0]) + message[1..] + ".", DiagnosticSeverity.Warning);
        }
    }
}

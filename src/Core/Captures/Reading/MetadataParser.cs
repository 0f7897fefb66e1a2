using System.Text.RegularExpressions;

namespace Patchproof.Core.Captures.Reading;

/// <summary>Turns the lines above the header into metadata entries, and finds the sample interval and start time among them.</summary>
/// <remarks>
/// Line shapes: <c>key,value</c> and <c>key;value;unit</c> (split with CsvHelper on the file's delimiter,
/// or on comma, semicolon or tab), <c>key = value</c>, <c>key: value</c>, the same behind <c>#</c> or
/// <c>//</c>, <c>[Section]</c> names, and separator lines of dashes or equals signs (ignored). The earliest
/// of ':' '=' and a delimiter on the line decides the shape. The key spellings interpreted are listed in
/// docs/captures.md; keys compare without case, spaces or punctuation.
/// </remarks>
internal static partial class MetadataParser
{
    private static readonly string[] IntervalKeys =
        ["sampleinterval", "samplinginterval", "sampleperiod", "samplingperiod", "timestep", "timeincrement", "dt", "deltat",
         "timeinterval", "interval", "xincrement", "increment", "secondspersample", "timeresolution", "sampletime"];

    private static readonly string[] RateKeys =
        ["samplerate", "samplingrate", "samplefrequency", "samplingfrequency", "samplespersecond", "fs", "rate", "acquisitionrate"];

    private static readonly string[] StartKeys =
        ["starttime", "start", "t0", "tstart", "timeoffset", "xorigin", "firstsampletime", "timeoffirstsample"];

    /// <summary>Reads the entries of the metadata lines.</summary>
    public static IReadOnlyList<MetadataEntry> Parse(IReadOnlyList<HeadLine> lines, byte delimiter, string? file)
    {
        var entries = new List<MetadataEntry>();
        string? section = null;
        foreach (var line in lines)
        {
            var text = line.Text.Trim();
            if (text.StartsWith('#') || text.StartsWith("//", StringComparison.Ordinal))
            {
                text = text.TrimStart('#', '/').Trim();
            }

            if (text.Length == 0 || DialectSniffer.IsSeparatorLine(text))
            {
                continue;
            }

            var bare = text.Trim(',', ';', '\t', ' ');
            if (bare.StartsWith('[') && bare.EndsWith(']'))
            {
                section = bare[1..^1].Trim();
                continue;
            }

            var entry = ParseLine(text, delimiter);
            if (entry is { } e)
            {
                var (key, unit) = SplitKeyUnit(e.Key);
                entries.Add(new MetadataEntry(key, e.Value, e.Unit ?? unit, section, file, line.Number));
            }
        }

        return entries;
    }

    /// <summary>The sample interval in seconds the metadata states (an interval, or the inverse of a rate), with the entry it came from.</summary>
    public static (double Seconds, MetadataEntry Entry)? FindInterval(IReadOnlyList<MetadataEntry> entries, byte decimalSeparator)
    {
        foreach (var entry in entries)
        {
            var key = NormalizeKey(entry.Key);
            if (IntervalKeys.Contains(key) && TryReadQuantity(entry, decimalSeparator, out var value, out var unit))
            {
                var factor = unit is null ? 1 : Units.SecondsPer(unit);
                if (factor is { } f && value * f > 0 && double.IsFinite(value * f))
                {
                    return (value * f, entry);
                }
            }

            if (RateKeys.Contains(key) && TryReadQuantity(entry, decimalSeparator, out var rate, out var rateUnit))
            {
                var factor = rateUnit is null ? 1 : Units.HertzPer(rateUnit);
                if (factor is { } f && rate * f > 0 && double.IsFinite(rate * f))
                {
                    return (1.0 / (rate * f), entry);
                }
            }
        }

        return null;
    }

    /// <summary>The start time in seconds the metadata states, if any.</summary>
    public static double? FindStart(IReadOnlyList<MetadataEntry> entries, byte decimalSeparator)
    {
        foreach (var entry in entries)
        {
            if (StartKeys.Contains(NormalizeKey(entry.Key)) && TryReadQuantity(entry, decimalSeparator, out var value, out var unit))
            {
                var factor = unit is null ? 1 : Units.SecondsPer(unit);
                if (factor is { } f && double.IsFinite(value * f))
                {
                    return value * f;
                }
            }
        }

        return null;
    }

    /// <summary>The key spellings read as a sample interval, a sample rate and a start time, for the documentation and messages.</summary>
    public static string KnownKeysSentence =>
        "sample interval (" + string.Join(", ", IntervalKeys) + "), sample rate (" + string.Join(", ", RateKeys) + ")";

    private static bool TryReadQuantity(MetadataEntry entry, byte decimalSeparator, out double value, out string? unit)
    {
        unit = entry.Unit;
        value = 0;
        var match = Quantity().Match(entry.Value);
        if (!match.Success)
        {
            return false;
        }

        var inline = match.Groups["unit"].Value;
        if (inline.Length > 0)
        {
            unit = inline;
        }

        return NumberParser.TryParse(match.Groups["number"].Value, (char)decimalSeparator, out value);
    }

    private static string NormalizeKey(string key) =>
        new(key.ToLowerInvariant().Where(char.IsLetterOrDigit).ToArray());

    private static (string Key, string? Unit) SplitKeyUnit(string key)
    {
        var match = KeyWithUnit().Match(key);
        return match.Success && Units.IsKnownUnit(match.Groups["unit"].Value)
            ? (match.Groups["key"].Value.Trim(), match.Groups["unit"].Value.Trim())
            : (key, null);
    }

    private static MetadataEntry? ParseLine(string text, byte delimiter)
    {
        var colon = IndexOrMax(text, ':');
        var equals = IndexOrMax(text, '=');
        var delimiters = delimiter == (byte)' ' ? new[] { '\t', ';', ',' } : [(char)delimiter, '\t', ';', ','];
        var bestDelimiter = '\0';
        var delimiterAt = int.MaxValue;
        foreach (var d in delimiters)
        {
            var at = IndexOrMax(text, d);
            if (at < delimiterAt)
            {
                delimiterAt = at;
                bestDelimiter = d;
            }
        }

        var keyValueAt = Math.Min(colon, equals);
        if (keyValueAt < delimiterAt && keyValueAt != int.MaxValue)
        {
            var key = text[..keyValueAt].Trim().Trim('"');
            var value = text[(keyValueAt + 1)..].Trim().Trim(',', ';', '\t').Trim().Trim('"');
            return key.Length == 0 ? null : new MetadataEntry(key, value, null, null, null, 0);
        }

        if (delimiterAt != int.MaxValue)
        {
            var fields = DialectSniffer.WithoutTrailingEmpty(DialectSniffer.SplitText(text, (byte)bestDelimiter));
            if (fields.Count == 0 || fields[0].Length == 0)
            {
                return null;
            }

            if (fields.Count == 3 && Units.IsKnownUnit(fields[2]))
            {
                return new MetadataEntry(fields[0], fields[1], fields[2], null, null, 0);
            }

            return new MetadataEntry(fields[0], string.Join(", ", fields.Skip(1)), null, null, null, 0);
        }

        // A line with no separator is a title or a comment: keep it as a key without a value.
        return new MetadataEntry(text, string.Empty, null, null, null, 0);
    }

    private static int IndexOrMax(string text, char c)
    {
        var at = text.IndexOf(c, StringComparison.Ordinal);
        return at < 0 ? int.MaxValue : at;
    }

    [GeneratedRegex(@"^\s*(?<number>[-+]?(?:\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE][-+]?\d+)?)\s*(?<unit>[^\s\d][^\s]*)?\s*$", RegexOptions.CultureInvariant)]
    private static partial Regex Quantity();

    [GeneratedRegex(@"^(?<key>.*?)\s*[\(\[]\s*(?<unit>[^\(\)\[\]]+?)\s*[\)\]]\s*$", RegexOptions.CultureInvariant)]
    private static partial Regex KeyWithUnit();
}

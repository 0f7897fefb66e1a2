using System.Globalization;
using System.Text;

namespace Patchproof.Core.Tests.Captures;

/// <summary>How the metadata block of a test file is written.</summary>
public enum MetadataShape
{
    None,
    KeyCommaValue,
    KeySemicolonValueUnit,
    KeyEqualsValue,
    KeyColonValue,
    HashComments,
    BracketedSections,
}

/// <summary>How the header names its units.</summary>
public enum HeaderStyle
{
    Parentheses,
    Brackets,
    UnitsRow,
    NoUnits,
    NoHeader,
}

/// <summary>One variation of the dialect matrix: every way a test file can differ from plain comma CSV.</summary>
public sealed record DialectSpec
{
    public char Delimiter { get; init; } = ',';
    public bool DecimalComma { get; init; }
    public MetadataShape Metadata { get; init; } = MetadataShape.None;
    public HeaderStyle Header { get; init; } = HeaderStyle.Parentheses;
    public string TimeUnit { get; init; } = "s";
    public bool TimeColumn { get; init; } = true;
    public bool IndexColumn { get; init; }
    public bool Quoted { get; init; }
    public bool ByteOrderMark { get; init; }
    public bool CrLf { get; init; }
    public bool TrailingDelimiter { get; init; }
    public bool SeparatorLine { get; init; }
    public string ChannelUnit { get; init; } = "V";

    public override string ToString()
    {
        var parts = new List<string> { Delimiter switch { ',' => "comma", ';' => "semicolon", '\t' => "tab", _ => "spaces" } };
        if (DecimalComma) parts.Add("decimal-comma");
        if (Metadata != MetadataShape.None) parts.Add(Metadata.ToString());
        parts.Add(Header.ToString());
        if (TimeColumn) parts.Add("time-" + TimeUnit); else parts.Add("no-time-column");
        if (IndexColumn) parts.Add("index");
        if (Quoted) parts.Add("quoted");
        if (ByteOrderMark) parts.Add("bom");
        if (CrLf) parts.Add("crlf");
        if (TrailingDelimiter) parts.Add("trailing");
        if (SeparatorLine) parts.Add("separator-line");
        if (ChannelUnit != "V") parts.Add("unit-" + ChannelUnit);
        return string.Join("+", parts);
    }
}

/// <summary>Writes capture files of a given dialect whose values are known exactly, for the reader's tests.</summary>
public static class CaptureFileBuilder
{
    /// <summary>Sample interval of the generated files, in seconds.</summary>
    public const double IntervalSeconds = 2e-6;

    /// <summary>The value of channel k (0-based) at sample i in volts, before printing.</summary>
    public static double Volts(int k, int i) => k switch
    {
        0 => 4.0 * Math.Sin(2 * Math.PI * i / 100.0),
        1 => (i / 25 % 2 == 0 ? 3.3 : 0.0) + (0.01 * Math.Cos(i)),
        _ => 1.5 + (0.5 * Math.Sin(2 * Math.PI * i / 400.0)),
    };

    /// <summary>The text of a file with <paramref name="rows"/> rows and <paramref name="channels"/> channels.</summary>
    public static byte[] Build(DialectSpec spec, int rows = 200, int channels = 3)
    {
        var nl = spec.CrLf ? "\r\n" : "\n";
        var d = spec.Delimiter == ' ' ? "  " : spec.Delimiter.ToString();
        var sb = new StringBuilder();
        var timeFactor = spec.TimeUnit switch { "ms" => 1e3, "us" or "µs" => 1e6, "ns" => 1e9, _ => 1.0 };
        var voltFactor = spec.ChannelUnit == "mV" ? 1e3 : 1.0;
        WriteMetadata(sb, spec, nl);
        if (spec.SeparatorLine)
        {
            sb.Append("--------").Append(nl);
        }

        var names = new List<string>();
        var units = new List<string>();
        if (spec.IndexColumn)
        {
            names.Add("Index");
            units.Add(string.Empty);
        }

        if (spec.TimeColumn)
        {
            names.Add("Time");
            units.Add(spec.TimeUnit);
        }

        for (var k = 0; k < channels; k++)
        {
            names.Add($"CH{k + 1}");
            units.Add(spec.ChannelUnit);
        }

        switch (spec.Header)
        {
            case HeaderStyle.Parentheses:
                AppendRow(sb, names.Select((n, j) => units[j].Length == 0 ? n : $"{n} ({units[j]})"), d, spec, nl, quote: spec.Quoted);
                break;
            case HeaderStyle.Brackets:
                AppendRow(sb, names.Select((n, j) => units[j].Length == 0 ? n : $"{n} [{units[j]}]"), d, spec, nl, quote: spec.Quoted);
                break;
            case HeaderStyle.UnitsRow:
                AppendRow(sb, names, d, spec, nl, quote: spec.Quoted);
                AppendRow(sb, units, d, spec, nl, quote: spec.Quoted);
                break;
            case HeaderStyle.NoUnits:
                AppendRow(sb, names.Select(n => n == "Time" ? "t" : n), d, spec, nl, quote: spec.Quoted);
                break;
        }

        for (var i = 0; i < rows; i++)
        {
            var fields = new List<string>();
            if (spec.IndexColumn)
            {
                fields.Add(i.ToString(CultureInfo.InvariantCulture));
            }

            if (spec.TimeColumn)
            {
                fields.Add(Number(i * IntervalSeconds * timeFactor, "E6", spec.DecimalComma));
            }

            for (var k = 0; k < channels; k++)
            {
                fields.Add(Number(Volts(k, i) * voltFactor, "F4", spec.DecimalComma));
            }

            AppendRow(sb, fields, d, spec, nl, quote: spec.Quoted);
        }

        var text = Encoding.UTF8.GetBytes(sb.ToString());
        return spec.ByteOrderMark ? [0xEF, 0xBB, 0xBF, .. text] : text;
    }

    /// <summary>The value as printed to <c>F4</c> (in V or mV), back in volts: what an exact reader must return.</summary>
    public static double PrintedVolts(int k, int i, string unit) =>
        unit == "mV"
            ? double.Parse((Volts(k, i) * 1e3).ToString("F4", CultureInfo.InvariantCulture), CultureInfo.InvariantCulture) * 1e-3
            : double.Parse(Volts(k, i).ToString("F4", CultureInfo.InvariantCulture), CultureInfo.InvariantCulture);

    /// <summary>Writes bytes to a new file in a per-test temporary folder and returns its path.</summary>
    public static string WriteTemp(byte[] content, string name = "capture.csv")
    {
        var folder = Path.Combine(Path.GetTempPath(), "patchproof-tests", Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(folder);
        var path = Path.Combine(folder, name);
        File.WriteAllBytes(path, content);
        return path;
    }

    /// <summary>Writes text (UTF-8, no byte-order mark) to a temporary file.</summary>
    public static string WriteTemp(string content, string name = "capture.csv") => WriteTemp(Encoding.UTF8.GetBytes(content), name);

    private static string Number(double value, string format, bool decimalComma)
    {
        var text = value.ToString(format, CultureInfo.InvariantCulture);
        return decimalComma ? text.Replace('.', ',') : text;
    }

    private static void AppendRow(StringBuilder sb, IEnumerable<string> fields, string d, DialectSpec spec, string nl, bool quote)
    {
        sb.Append(string.Join(d, fields.Select(f => quote ? $"\"{f}\"" : f)));
        if (spec.TrailingDelimiter && spec.Delimiter != ' ')
        {
            sb.Append(d);
        }

        sb.Append(nl);
    }

    private static void WriteMetadata(StringBuilder sb, DialectSpec spec, string nl)
    {
        var interval = Number(IntervalSeconds * 1e6, "F1", spec.DecimalComma);
        var d = spec.Delimiter == ' ' ? "\t" : spec.Delimiter.ToString();
        switch (spec.Metadata)
        {
            case MetadataShape.KeyCommaValue:
                sb.Append("Bench").Append(d).Append("Quillhaven Lab B, bench 4").Append(nl);
                sb.Append("Sample interval").Append(d).Append(interval).Append(" us").Append(nl);
                break;
            case MetadataShape.KeySemicolonValueUnit:
                sb.Append("Bench").Append(d).Append("QH-L3").Append(nl);
                sb.Append("Sample interval").Append(d).Append(interval).Append(d).Append("us").Append(nl);
                break;
            case MetadataShape.KeyEqualsValue:
                sb.Append("Bench = QH-L3").Append(nl);
                sb.Append("Sample rate = 500 kSa/s").Append(nl);
                break;
            case MetadataShape.KeyColonValue:
                sb.Append("Board: QH-L3 Wren").Append(nl);
                sb.Append("Sample interval (us): ").Append(interval).Append(nl);
                break;
            case MetadataShape.HashComments:
                sb.Append("# exported by the bench scope").Append(nl);
                sb.Append("# sample interval: ").Append(interval).Append(" µs").Append(nl);
                break;
            case MetadataShape.BracketedSections:
                sb.Append("[Instrument]").Append(nl);
                sb.Append("Bench=4").Append(nl);
                sb.Append("[Acquisition]").Append(nl);
                sb.Append("Sample interval=").Append(interval).Append(" us").Append(nl);
                sb.Append("[Data]").Append(nl);
                break;
        }
    }
}

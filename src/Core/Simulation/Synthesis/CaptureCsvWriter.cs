using System.Globalization;
using Patchproof.Core.Captures;

namespace Patchproof.Core.Simulation.Synthesis;

/// <summary>Writes a capture as CSV in a chosen dialect (<see cref="CaptureCsvStyle"/>), the way a scope exports one.</summary>
/// <remarks>Metadata first (comment lines or key/value rows), then the header, then one row per
/// sample: time (s or ms) and each channel in volts. Numbers are invariant-culture, with a decimal
/// comma when the style asks; channel values carry 6 decimals, enough for 8-bit steps.</remarks>
public static class CaptureCsvWriter
{
    /// <summary>Writes the capture.</summary>
    /// <param name="capture">The capture.</param>
    /// <param name="writer">Where to write.</param>
    /// <param name="style">The dialect.</param>
    public static void Write(Capture capture, TextWriter writer, CaptureCsvStyle style)
    {
        ArgumentNullException.ThrowIfNull(capture);
        ArgumentNullException.ThrowIfNull(writer);
        ArgumentNullException.ThrowIfNull(style);
        Preconditions.CheckArgumentRange(nameof(style), !(style.DecimalComma && style.Delimiter == ','), "a decimal comma needs a delimiter other than a comma");
        var delimiter = style.Delimiter.ToString();
        foreach (var entry in capture.Metadata)
        {
            var value = entry.Unit is null ? entry.Value : $"{entry.Value} {entry.Unit}";
            writer.WriteLine(style.CommentMetadata ? $"# {entry.Key}: {value}" : $"{entry.Key}{delimiter}{value}");
        }

        var timeUnit = style.TimeInMilliseconds ? "ms" : "s";
        var names = new List<string> { style.Units == HeaderUnits.UnitsRow ? "TIME" : "Time" };
        names.AddRange(capture.Channels.Select(channel => channel.Name));
        var units = new List<string> { timeUnit };
        units.AddRange(capture.Channels.Select(channel => channel.Unit));
        switch (style.Units)
        {
            case HeaderUnits.Parentheses:
                writer.WriteLine(string.Join(delimiter, names.Zip(units, (name, unit) => $"{name} ({unit})")));
                break;
            case HeaderUnits.Brackets:
                writer.WriteLine(string.Join(delimiter, names.Zip(units, (name, unit) => $"{name} [{unit}]")));
                break;
            default:
                writer.WriteLine(string.Join(delimiter, names));
                writer.WriteLine(string.Join(delimiter, units));
                break;
        }

        var timeScale = style.TimeInMilliseconds ? 1e3 : 1.0;
        var timeFormat = style.TimeInMilliseconds ? "0.000######" : "0.000000####";
        var row = new System.Text.StringBuilder();
        for (var k = 0; k < capture.SampleCount; k++)
        {
            row.Clear();
            row.Append(Number(capture.TimeBase.TimeAtSeconds(k) * timeScale, timeFormat, style.DecimalComma));
            foreach (var channel in capture.Channels)
            {
                row.Append(style.Delimiter);
                row.Append(Number(channel.Samples.Span[k], "0.000###", style.DecimalComma));
            }

            writer.WriteLine(row);
        }
    }

    private static string Number(double value, string format, bool decimalComma)
    {
        var text = value.ToString(format, CultureInfo.InvariantCulture);
        return decimalComma ? text.Replace('.', ',') : text;
    }
}

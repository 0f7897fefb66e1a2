using System.Globalization;
using System.Text;

namespace Patchproof.Server.Tests.Hosting;

/// <summary>Invented capture files for the upload tests (demo-style data, no reference values).</summary>
internal static class CaptureFiles
{
    /// <summary>A scope-style export: two metadata lines, a header with units, then time and two channels of a 50 Hz sine and cosine sampled at 10 kHz.</summary>
    public static byte[] TwoChannelScopeExport(int rows)
    {
        var text = new StringBuilder(rows * 40);
        text.Append("Sample Interval,1.0e-04\nRecord Length,").Append(rows.ToString(CultureInfo.InvariantCulture)).Append('\n');
        text.Append("Time (s),CH1 (V),CH2 (V)\n");
        for (var i = 0; i < rows; i++)
        {
            var t = i * 1e-4;
            var phase = 2 * Math.PI * 50 * t;
            text.Append(CultureInfo.InvariantCulture, $"{t:E6},{2.5 * Math.Sin(phase):E6},{1.5 * Math.Cos(phase):E6}\n");
        }

        return Encoding.ASCII.GetBytes(text.ToString());
    }

    /// <summary>The same export with one field on the given 1-based data row replaced by text.</summary>
    public static byte[] WithBadField(int rows, int dataRow, string badField)
    {
        var lines = Encoding.ASCII.GetString(TwoChannelScopeExport(rows)).Split('\n');
        var index = 3 + dataRow - 1;
        var fields = lines[index].Split(',');
        fields[1] = badField;
        lines[index] = string.Join(',', fields);
        return Encoding.ASCII.GetBytes(string.Join('\n', lines));
    }
}

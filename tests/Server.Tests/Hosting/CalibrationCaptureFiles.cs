using System.Globalization;
using System.Text;
using Patchproof.TestSupport;

namespace Patchproof.Server.Tests.Hosting;

/// <summary>Calibration captures made up for tests: one slow node seen by every channel through its own gain, with noise and
/// 8-bit quantization over a ±5 V window, written as a scope CSV.</summary>
internal static class CalibrationCaptureFiles
{
    /// <summary>Channel c reads Quantize(gain_c · node + noise); with <paramref name="secondChannelOnAnotherNode"/> CH2 sees an unrelated tone instead.</summary>
    public static byte[] Csv(double[] gains, int seed, bool secondChannelOnAnotherNode = false, int count = 20_000)
    {
        var random = new Random(seed);
        var step = 10.0 / 255;
        var text = new StringBuilder("time_s," + string.Join(',', gains.Select((_, c) => $"CH{c + 1}")) + "\n");
        for (var i = 0; i < count; i++)
        {
            var node = 4.0 * ((0.7 * Math.Sin(2 * Math.PI * i / 997.0)) + (0.3 * Math.Sin((2 * Math.PI * i / 313.0) + 1)));
            var other = 4.0 * Math.Sin(2 * Math.PI * i / 151.0);
            text.Append((i * 1e-5).ToString("E6", CultureInfo.InvariantCulture));
            for (var c = 0; c < gains.Length; c++)
            {
                var seen = c == 1 && secondChannelOnAnotherNode ? other : node;
                var volts = (gains[c] * seen) + (0.01 * GaussianNoise.Next(random));
                text.Append(',').Append((Math.Clamp(Math.Round(volts / step), -127, 128) * step).ToString("G6", CultureInfo.InvariantCulture));
            }

            text.Append('\n');
        }

        return Encoding.ASCII.GetBytes(text.ToString());
    }
}

using Patchproof.Core.Captures;
using Patchproof.TestSupport;

namespace Patchproof.Core.Tests.Captures.Calibration;

/// <summary>Calibration captures made up for tests: one node seen by every channel through its own gain and offset, with noise
/// and 8-bit quantization over each channel's window.</summary>
internal static class CalibrationCaptures
{
    /// <summary>Each channel reads Quantize(gain_c · node + offset_c + noise) over [-window_c, window_c] with 256 levels.</summary>
    public static Capture FromNode(IReadOnlyList<double> node, double intervalSeconds, double[] gains, double[] offsetsVolts, double[] windowVolts, double noiseVolts, int seed)
    {
        var random = new Random(seed);
        var channels = new List<CaptureChannel>();
        for (var c = 0; c < gains.Length; c++)
        {
            var step = 2 * windowVolts[c] / 255;
            var samples = new float[node.Count];
            for (var i = 0; i < node.Count; i++)
            {
                var volts = (gains[c] * node[i]) + offsetsVolts[c] + (noiseVolts * GaussianNoise.Next(random));
                samples[i] = (float)(Math.Clamp(Math.Round(volts / step), -127, 128) * step);
            }

            channels.Add(new CaptureChannel($"CH{c + 1}", "V", samples, "calibration.csv", c + 2));
        }

        return new Capture(new UniformTimeBase(0, intervalSeconds, node.Count), channels, []);
    }

    /// <summary>A slow two-tone node signal, amplitude about <paramref name="amplitudeVolts"/>.</summary>
    public static double[] TwoTones(int count, double amplitudeVolts) =>
        Enumerable.Range(0, count).Select(i => amplitudeVolts * ((0.7 * Math.Sin(2 * Math.PI * i / 997.0)) + (0.3 * Math.Sin((2 * Math.PI * i / 313.0) + 1)))).ToArray();
}

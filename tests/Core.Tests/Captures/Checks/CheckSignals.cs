using Patchproof.Core.Captures;

namespace Patchproof.Core.Tests.Captures.Checks;

/// <summary>Captures with a known answer for the check tests.</summary>
internal static class CheckSignals
{
    public static Capture Uniform(double intervalSeconds, params float[][] channels) =>
        new(new UniformTimeBase(0, intervalSeconds, channels[0].Length),
            channels.Select((c, k) => new CaptureChannel($"CH{k + 1}", "V", c, null, k + 1)).ToArray(), []);

    public static Capture Explicit(double[] times, float[] channel) =>
        new(new ExplicitTimeBase(times), [new CaptureChannel("CH1", "V", channel, null, 2)], []);

    public static float[] Generate(int n, Func<int, double> f) => Enumerable.Range(0, n).Select(i => (float)f(i)).ToArray();

    public static double Quantize(double value, double step) => Math.Round(value / step) * step;

    /// <summary>Box-Muller Gaussian noise of unit variance from a seeded generator.</summary>
    public static Func<double> Gaussian(int seed)
    {
        var random = new Random(seed);
        return () => Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());
    }
}

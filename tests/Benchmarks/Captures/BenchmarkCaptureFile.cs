using System.Globalization;
using System.Text;

namespace Patchproof.Benchmarks.Captures;

/// <summary>Writes the capture file of shared/BENCHMARKS.md section 2: three key,value lines, a header, rows of four %.6e numbers.</summary>
/// <remarks>
/// Channels: a 1 kHz sine with noise, a 250 Hz square wave with RC edges from 0 to 3.3 V with noise, a 50 Hz sine
/// on a slow ramp with noise; sample interval 2 µs; comma separated, LF line ends. The numbers are written in C's
/// %.6e form (two-digit exponent), as the reference programs read them.
/// </remarks>
internal static class BenchmarkCaptureFile
{
    public const double IntervalSeconds = 2e-6;

    public static string Write(string folder, int rows)
    {
        Directory.CreateDirectory(folder);
        var path = Path.Combine(folder, $"capture-{rows}.csv");
        if (File.Exists(path))
        {
            return path;
        }

        var random = new Random(20261201);
        using var writer = new StreamWriter(path, false, new UTF8Encoding(false), 1 << 20) { NewLine = "\n" };
        writer.WriteLine("instrument,bench scope (Quillhaven Lab B)");
        writer.WriteLine("sample interval,2e-6");
        writer.WriteLine("channels,3");
        writer.WriteLine("time,ch1,ch2,ch3");
        var line = new StringBuilder(64);
        const double rc = 50e-6;
        for (var i = 0; i < rows; i++)
        {
            var t = i * IntervalSeconds;
            var ch1 = Math.Sin(2 * Math.PI * 1000 * t) + (0.01 * Gaussian(random));
            var phase = (t * 250) % 1.0;
            var sinceEdge = (phase < 0.5 ? phase : phase - 0.5) / 250;
            var ch2 = (phase < 0.5 ? 3.3 * (1 - Math.Exp(-sinceEdge / rc)) : 3.3 * Math.Exp(-sinceEdge / rc)) + (0.01 * Gaussian(random));
            var ch3 = (0.5 * Math.Sin(2 * Math.PI * 50 * t)) + (0.1 * t) + (0.01 * Gaussian(random));
            line.Clear();
            line.Append(E6(t)).Append(',').Append(E6(ch1)).Append(',').Append(E6(ch2)).Append(',').Append(E6(ch3));
            writer.WriteLine(line);
        }

        return path;
    }

    /// <summary>C's %.6e: one digit, six decimals, a signed exponent of at least two digits.</summary>
    public static string E6(double value) => value.ToString("0.000000e+00", CultureInfo.InvariantCulture);

    private static double Gaussian(Random random) =>
        Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());
}

using System.Globalization;
using System.Text;

namespace Patchproof.EndToEnd.Tests.Support;

/// <summary>Writes an invented demo capture: a Lorenz board (sigma 10, rho 28, beta 8/3) as a three-channel scope CSV.</summary>
/// <remarks>
/// Demo data only, in the demo scenario's terms: 1 ms per problem time unit (100 kOhm with 10 nF), 0.2 V per unit,
/// sampled every 10 µs. Integrated with classical RK4 at the sample step, which is plenty for a demo upload.
/// </remarks>
public static class DemoCapture
{
    /// <summary>Writes <paramref name="rows"/> sample rows to a new file and returns its path.</summary>
    public static string Write(string fileName, int rows = 20_000)
    {
        const double sigma = 10, rho = 28, beta = 8.0 / 3, stepUnits = 0.01, secondsPerUnit = 1e-3, voltsPerUnit = 0.2;
        var state = new[] { 1.0, 1.0, 1.0 };
        for (var i = 0; i < 2_000; i++)
        {
            Step(state, stepUnits);
        }

        var text = new StringBuilder();
        text.Append("time_s,CH1,CH2,CH3\n");
        for (var i = 0; i < rows; i++)
        {
            text.Append(CultureInfo.InvariantCulture, $"{i * stepUnits * secondsPerUnit:0.000000},{state[0] * voltsPerUnit:0.0000},{state[1] * voltsPerUnit:0.0000},{state[2] * voltsPerUnit:0.0000}\n");
            Step(state, stepUnits);
        }

        var path = Path.Combine(Path.GetTempPath(), fileName);
        File.WriteAllText(path, text.ToString());
        return path;

        static void Derivative(ReadOnlySpan<double> s, Span<double> d)
        {
            d[0] = sigma * (s[1] - s[0]);
            d[1] = (s[0] * (rho - s[2])) - s[1];
            d[2] = (s[0] * s[1]) - (beta * s[2]);
        }

        static void Step(double[] s, double h)
        {
            Span<double> k1 = stackalloc double[3], k2 = stackalloc double[3], k3 = stackalloc double[3], k4 = stackalloc double[3], t = stackalloc double[3];
            Derivative(s, k1);
            for (var j = 0; j < 3; j++) t[j] = s[j] + (h / 2 * k1[j]);
            Derivative(t, k2);
            for (var j = 0; j < 3; j++) t[j] = s[j] + (h / 2 * k2[j]);
            Derivative(t, k3);
            for (var j = 0; j < 3; j++) t[j] = s[j] + (h * k3[j]);
            Derivative(t, k4);
            for (var j = 0; j < 3; j++) s[j] += h / 6 * (k1[j] + (2 * k2[j]) + (2 * k3[j]) + k4[j]);
        }
    }
}

namespace Patchproof.Core.Tests.Estimation;

/// <summary>Synthetic Lorenz captures for recovery tests, made with a fixed-step classical RK4 (a test-only integrator).</summary>
/// <remarks>The capture of BENCHMARKS.md section 3: s = 10.5, r = 27.3, b = 2.6; 10 time units of transient dropped;
/// 20 time units at dt = 0.002 (10,001 samples); Gaussian noise of 0.5 % of each channel's SD; quantized to 40/256.</remarks>
internal static class SyntheticLorenz
{
    public const double Sigma = 10.5;
    public const double Rho = 27.3;
    public const double Beta = 2.6;
    public const double SampleInterval = 0.002;

    /// <summary>The clean states (x, y, z) at every sample, and their exact derivatives from the equations.</summary>
    public static (double[][] States, double[][] Derivatives) Clean(int samples = 10_001, double transient = 10.0, int substeps = 4)
    {
        var state = new[] { 1.0, 1.0, 1.0 };
        var h = SampleInterval / substeps;
        for (var k = 0; k < (int)Math.Round(transient / h); k++)
        {
            Step(state, h);
        }

        var states = new[] { new double[samples], new double[samples], new double[samples] };
        var derivatives = new[] { new double[samples], new double[samples], new double[samples] };
        var rate = new double[3];
        for (var i = 0; i < samples; i++)
        {
            Rate(state, rate);
            for (var c = 0; c < 3; c++)
            {
                states[c][i] = state[c];
                derivatives[c][i] = rate[c];
            }

            for (var s = 0; s < substeps; s++)
            {
                Step(state, h);
            }
        }

        return (states, derivatives);
    }

    /// <summary>Adds Gaussian noise of <paramref name="noiseFraction"/> of each channel's SD, then rounds to multiples of <paramref name="quantum"/>.</summary>
    public static double[][] Capture(double[][] states, int seed, double noiseFraction = 0.005, double quantum = 40.0 / 256.0)
    {
        var random = new Random(seed);
        return states.Select(channel =>
        {
            var mean = channel.Average();
            var sd = Math.Sqrt(channel.Sum(v => (v - mean) * (v - mean)) / channel.Length);
            return channel.Select(v => Math.Round((v + noiseFraction * sd * Gaussian(random)) / quantum) * quantum).ToArray();
        }).ToArray();
    }

    public static double Gaussian(Random random) =>
        Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());

    private static void Rate(ReadOnlySpan<double> v, Span<double> rate)
    {
        rate[0] = Sigma * (v[1] - v[0]);
        rate[1] = v[0] * (Rho - v[2]) - v[1];
        rate[2] = v[0] * v[1] - Beta * v[2];
    }

    private static void Step(double[] v, double h)
    {
        Span<double> k1 = stackalloc double[3], k2 = stackalloc double[3], k3 = stackalloc double[3], k4 = stackalloc double[3], t = stackalloc double[3];
        Rate(v, k1);
        for (var c = 0; c < 3; c++) t[c] = v[c] + 0.5 * h * k1[c];
        Rate(t, k2);
        for (var c = 0; c < 3; c++) t[c] = v[c] + 0.5 * h * k2[c];
        Rate(t, k3);
        for (var c = 0; c < 3; c++) t[c] = v[c] + h * k3[c];
        Rate(t, k4);
        for (var c = 0; c < 3; c++) v[c] += h / 6 * (k1[c] + 2 * k2[c] + 2 * k3[c] + k4[c]);
    }
}

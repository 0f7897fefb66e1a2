namespace Patchproof.Benchmarks.Estimation;

/// <summary>The BENCHMARKS.md section 3 capture: Lorenz s = 10.5, r = 27.3, b = 2.6, 10 time units of transient, dt = 0.002, 0.5 % noise, quantized to 40/256 (RK4, four substeps per sample); <c>seed</c> picks the noise realization.</summary>
internal static class BenchmarkLorenz
{
    public static double[][] Capture(int samples, int seed = 1)
    {
        var v = new[] { 1.0, 1.0, 1.0 };
        const double h = 0.0005;
        for (var k = 0; k < 20_000; k++)
        {
            Step(v, h);
        }

        var channels = new[] { new double[samples], new double[samples], new double[samples] };
        for (var i = 0; i < samples; i++)
        {
            for (var c = 0; c < 3; c++)
            {
                channels[c][i] = v[c];
            }

            for (var s = 0; s < 4; s++)
            {
                Step(v, h);
            }
        }

        var random = new Random(seed);
        foreach (var channel in channels)
        {
            var mean = channel.Average();
            var sd = Math.Sqrt(channel.Sum(x => (x - mean) * (x - mean)) / channel.Length);
            for (var i = 0; i < channel.Length; i++)
            {
                var noise = Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());
                channel[i] = Math.Round((channel[i] + 0.005 * sd * noise) / (40.0 / 256)) * (40.0 / 256);
            }
        }

        return channels;
    }

    private static void Rate(double[] v, double[] rate)
    {
        rate[0] = 10.5 * (v[1] - v[0]);
        rate[1] = v[0] * (27.3 - v[2]) - v[1];
        rate[2] = v[0] * v[1] - 2.6 * v[2];
    }

    private static void Step(double[] v, double h)
    {
        double[] k1 = new double[3], k2 = new double[3], k3 = new double[3], k4 = new double[3], t = new double[3];
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

namespace Patchproof.Benchmarks.Dynamics;

/// <summary>A Lorenz (10, 28, 8/3) record sampled at dt = 0.01, made with a plain RK4 (h = dt / 4) after a transient of 50.</summary>
internal static class LorenzCapture
{
    public static double[][] Generate(int samples, double transient = 50)
    {
        const double dt = 0.01;
        const int substeps = 4;
        const double h = dt / substeps;
        var s = new[] { 1.0, 1.0, 1.0 };
        var channels = new[] { new double[samples], new double[samples], new double[samples] };
        for (var step = 0; step < (int)(transient / h); step++)
        {
            Step(s, h);
        }

        for (var t = 0; t < samples; t++)
        {
            for (var c = 0; c < 3; c++)
            {
                channels[c][t] = s[c];
            }

            for (var k = 0; k < substeps; k++)
            {
                Step(s, h);
            }
        }

        return channels;
    }

    private static void Step(double[] s, double h)
    {
        Span<double> k1 = stackalloc double[3];
        Span<double> k2 = stackalloc double[3];
        Span<double> k3 = stackalloc double[3];
        Span<double> k4 = stackalloc double[3];
        Span<double> y = stackalloc double[3];
        Field(s, k1);
        for (var i = 0; i < 3; i++) y[i] = s[i] + 0.5 * h * k1[i];
        Field(y, k2);
        for (var i = 0; i < 3; i++) y[i] = s[i] + 0.5 * h * k2[i];
        Field(y, k3);
        for (var i = 0; i < 3; i++) y[i] = s[i] + h * k3[i];
        Field(y, k4);
        for (var i = 0; i < 3; i++) s[i] += h / 6 * (k1[i] + 2 * k2[i] + 2 * k3[i] + k4[i]);
    }

    private static void Field(ReadOnlySpan<double> s, Span<double> d)
    {
        d[0] = 10 * (s[1] - s[0]);
        d[1] = s[0] * (28 - s[2]) - s[1];
        d[2] = s[0] * s[1] - 8.0 / 3 * s[2];
    }
}

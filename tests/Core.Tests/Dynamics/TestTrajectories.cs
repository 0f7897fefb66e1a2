namespace Patchproof.Core.Tests.Dynamics;

/// <summary>Sampled trajectories of the classic chaotic flows, integrated with a small fixed-step RK4 for the tests.</summary>
/// <remarks>Independent of the project's solver on purpose: the data-side invariants are checked
/// against published values on data made by a separate, plain integrator.</remarks>
internal static class TestTrajectories
{
    /// <summary>Lorenz (sigma, rho, beta) sampled every <paramref name="sampleInterval"/> after a transient of <paramref name="transient"/> time units.</summary>
    public static double[][] Lorenz(int samples, double sampleInterval, double sigma = 10, double rho = 28, double beta = 8.0 / 3, double transient = 50, int substeps = 4)
    {
        return Integrate(
            [1, 1, 1],
            (s, d) =>
            {
                d[0] = sigma * (s[1] - s[0]);
                d[1] = s[0] * (rho - s[2]) - s[1];
                d[2] = s[0] * s[1] - beta * s[2];
            },
            samples,
            sampleInterval,
            transient,
            substeps);
    }

    /// <summary>Rössler (a, b, c) sampled every <paramref name="sampleInterval"/> after a transient.</summary>
    public static double[][] Rossler(int samples, double sampleInterval, double a = 0.2, double b = 0.2, double c = 5.7, double transient = 200, int substeps = 4)
    {
        return Integrate(
            [1, 1, 1],
            (s, d) =>
            {
                d[0] = -s[1] - s[2];
                d[1] = s[0] + a * s[1];
                d[2] = b + s[2] * (s[0] - c);
            },
            samples,
            sampleInterval,
            transient,
            substeps);
    }

    /// <summary>Equally spaced times 0, dt, 2 dt, ...</summary>
    public static double[] Times(int samples, double sampleInterval) =>
        Enumerable.Range(0, samples).Select(i => i * sampleInterval).ToArray();

    private delegate void Field(double[] state, double[] derivative);

    private static double[][] Integrate(double[] start, Field field, int samples, double sampleInterval, double transient, int substeps)
    {
        var n = start.Length;
        var state = (double[])start.Clone();
        var h = sampleInterval / substeps;
        var k1 = new double[n];
        var k2 = new double[n];
        var k3 = new double[n];
        var k4 = new double[n];
        var stage = new double[n];

        void Step()
        {
            field(state, k1);
            for (var i = 0; i < n; i++) stage[i] = state[i] + 0.5 * h * k1[i];
            field(stage, k2);
            for (var i = 0; i < n; i++) stage[i] = state[i] + 0.5 * h * k2[i];
            field(stage, k3);
            for (var i = 0; i < n; i++) stage[i] = state[i] + h * k3[i];
            field(stage, k4);
            for (var i = 0; i < n; i++) state[i] += h / 6 * (k1[i] + 2 * k2[i] + 2 * k3[i] + k4[i]);
        }

        for (var s = 0; s < (int)Math.Round(transient / h); s++)
        {
            Step();
        }

        var channels = Enumerable.Range(0, n).Select(_ => new double[samples]).ToArray();
        for (var t = 0; t < samples; t++)
        {
            for (var i = 0; i < n; i++)
            {
                channels[i][t] = state[i];
            }

            for (var s = 0; s < substeps; s++)
            {
                Step();
            }
        }

        return channels;
    }
}

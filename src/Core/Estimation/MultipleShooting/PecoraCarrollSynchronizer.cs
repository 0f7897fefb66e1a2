using Patchproof.Core.Models;

namespace Patchproof.Core.Estimation.MultipleShooting;

/// <summary>The outcome of synchronizing a model's hidden states to the observed channels.</summary>
/// <param name="States">The full state at every sample: observed states from the channels, hidden ones from the driven subsystem (samples by states).</param>
/// <param name="ContractionRatio">How much the gap between two differently started copies of the driven subsystem shrank over the record (final gap / initial gap); far below 1 means it synchronizes.</param>
/// <param name="TransientSamples">The number of leading samples before the two copies agree to 1 % of the initial gap (the record length when they never do).</param>
public sealed record SynchronizationResult(IReadOnlyList<double[]> States, double ContractionRatio, int TransientSamples)
{
    /// <summary>True when the driven subsystem forgot its start: the hidden states it gives can be trusted after the transient.</summary>
    public bool Synchronizes => ContractionRatio < 1e-2;
}

/// <summary>Estimates hidden states by driving the model's unobserved subsystem with the observed channels (Pecora-Carroll).</summary>
/// <remarks>
/// <para>The hidden states h obey dh/dt = f_h(o(t), h) with the observed states o(t) replaced by the (de-offset, de-gained)
/// channels, linearly interpolated between samples. When the driven subsystem's conditional Lyapunov exponents are
/// negative, h(t) converges to the true hidden state after a transient, whatever it started from. The subsystem is
/// integrated by classical RK4 with the sample interval as its step. Two copies started far apart measure whether it
/// synchronizes at all.</para>
/// <para>Reference: 1. L. M. Pecora, T. L. Carroll, Synchronization in chaotic systems, Phys. Rev. Lett. 64 (1990) 821-824.</para>
/// </remarks>
public static class PecoraCarrollSynchronizer
{
    /// <summary>Drives the hidden states of <paramref name="system"/> with the observed ones.</summary>
    /// <param name="system">The model in the channels' units (volts, seconds).</param>
    /// <param name="parameters">The model's parameters.</param>
    /// <param name="observed">For each observed state index, its samples in the state's own units (offset and gain already removed).</param>
    /// <param name="intervalSeconds">The sample interval; positive.</param>
    /// <param name="hiddenStartScale">The size of the two starting guesses of the hidden states (the second copy starts at this value, the first at 0).</param>
    /// <returns>The full state per sample and how well it synchronized.</returns>
    public static SynchronizationResult Synchronize(IOdeSystem system, IReadOnlyList<double> parameters, IReadOnlyDictionary<int, IReadOnlyList<double>> observed, double intervalSeconds, double hiddenStartScale = 1.0)
    {
        Preconditions.CheckArgumentRange(nameof(intervalSeconds), intervalSeconds > 0, "must be positive");
        Preconditions.CheckArgumentRange(nameof(observed), observed.Count > 0, "needs at least one observed state");
        var n = system.StateCount;
        var count = observed.Values.First().Count;
        var p = parameters.ToArray();
        var first = Run(system, p, observed, intervalSeconds, count, n, 0.0);
        var second = Run(system, p, observed, intervalSeconds, count, n, hiddenStartScale);
        var hidden = Enumerable.Range(0, n).Where(j => !observed.ContainsKey(j)).ToArray();
        double Gap(int i) => Math.Sqrt(hidden.Sum(j => (first[i][j] - second[i][j]) * (first[i][j] - second[i][j])));
        var initialGap = Math.Max(Gap(0), double.Epsilon);
        var transient = count;
        for (var i = 0; i < count; i++)
        {
            if (Gap(i) <= 0.01 * initialGap)
            {
                transient = i;
                break;
            }
        }

        var ratio = hidden.Length == 0 ? 0 : Gap(count - 1) / initialGap;
        return new SynchronizationResult(first, double.IsFinite(ratio) ? ratio : double.PositiveInfinity, hidden.Length == 0 ? 0 : transient);
    }

    private static double[][] Run(IOdeSystem system, double[] parameters, IReadOnlyDictionary<int, IReadOnlyList<double>> observed, double dt, int count, int n, double hiddenStart)
    {
        var states = new double[count][];
        var x = new double[n];
        var stage = new double[n];
        var k1 = new double[n];
        var k2 = new double[n];
        var k3 = new double[n];
        var k4 = new double[n];
        for (var j = 0; j < n; j++)
        {
            x[j] = observed.TryGetValue(j, out var samples) ? samples[0] : hiddenStart;
        }

        states[0] = (double[])x.Clone();
        for (var i = 0; i + 1 < count; i++)
        {
            // Observed states follow the channels: at t_i, the midpoint, and t_{i+1}.
            Drive(observed, x, i, 0.0);
            system.Evaluate(i * dt, x, parameters, k1);
            Advance(x, k1, dt / 2, stage);
            Drive(observed, stage, i, 0.5);
            system.Evaluate((i + 0.5) * dt, stage, parameters, k2);
            Advance(x, k2, dt / 2, stage);
            Drive(observed, stage, i, 0.5);
            system.Evaluate((i + 0.5) * dt, stage, parameters, k3);
            Advance(x, k3, dt, stage);
            Drive(observed, stage, i, 1.0);
            system.Evaluate((i + 1) * dt, stage, parameters, k4);
            for (var j = 0; j < n; j++)
            {
                x[j] += dt / 6 * (k1[j] + 2 * k2[j] + 2 * k3[j] + k4[j]);
            }

            Drive(observed, x, i, 1.0);
            states[i + 1] = (double[])x.Clone();
        }

        return states;
    }

    private static void Advance(double[] x, double[] slope, double h, double[] destination)
    {
        for (var j = 0; j < x.Length; j++)
        {
            destination[j] = x[j] + h * slope[j];
        }
    }

    private static void Drive(IReadOnlyDictionary<int, IReadOnlyList<double>> observed, double[] state, int sample, double fraction)
    {
        foreach (var (index, samples) in observed)
        {
            var next = Math.Min(sample + 1, samples.Count - 1);
            state[index] = samples[sample] + fraction * (samples[next] - samples[sample]);
        }
    }
}

using System.Collections.Immutable;
using Patchproof.Core.Models;
using Patchproof.Core.Simulation;

namespace Patchproof.Core.Dynamics;

/// <summary>Runs the model from the reference record's state at one sample, sampled on the record's grid.</summary>
internal static class RestartedSimulation
{
    /// <summary>The simulated channels for samples start .. start + count - 1 (fewer if the solve stopped early), or an empty result when it failed at once.</summary>
    /// <exception cref="OperationCanceledException">When <paramref name="cancellation"/> is cancelled during the solve.</exception>
    public static double[][] Run(IOdeSystem system, ImmutableArray<double> parameters, IReadOnlyList<double[]> reference, double sampleInterval, int start, int count, double tolerance, CancellationToken cancellation = default)
    {
        var n = system.StateCount;
        var initial = new double[n];
        for (var c = 0; c < n; c++)
        {
            initial[c] = reference[c][start];
        }

        var startTime = start * sampleInterval;
        var problem = new OdeProblem(system, [.. initial], startTime, startTime + (count - 1) * sampleInterval, parameters);
        var solution = OdeSolver.Solve(problem, new DormandPrince45 { RelativeTolerance = tolerance, AbsoluteTolerance = tolerance, SampleInterval = sampleInterval, MaxSteps = 10_000_000, Cancellation = cancellation });
        var samples = Math.Min(count, solution.Count);
        var channels = new double[n][];
        for (var c = 0; c < n; c++)
        {
            channels[c] = new double[samples];
        }

        for (var k = 0; k < samples; k++)
        {
            var state = solution.StateAt(k);
            for (var c = 0; c < n; c++)
            {
                channels[c][k] = state[c];
            }
        }

        return channels;
    }

    /// <summary>The population standard deviation of each channel (1 where a channel is constant).</summary>
    public static double[] StandardDeviations(IReadOnlyList<double[]> channels)
    {
        var deviations = new double[channels.Count];
        for (var c = 0; c < channels.Count; c++)
        {
            var values = channels[c];
            var mean = values.Average();
            var sum = 0.0;
            foreach (var v in values)
            {
                sum += (v - mean) * (v - mean);
            }

            var deviation = Math.Sqrt(sum / values.Length);
            deviations[c] = deviation > 0 ? deviation : 1;
        }

        return deviations;
    }
}

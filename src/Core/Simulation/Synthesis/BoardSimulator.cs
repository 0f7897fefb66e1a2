using System.Collections.Immutable;
using Patchproof.Core.Circuits.Boards;

namespace Patchproof.Core.Simulation.Synthesis;

/// <summary>Simulates a board in volts and seconds through the project's Dormand-Prince solver.</summary>
/// <remarks>The board runs from t = 0 with the given initial voltages; samples start after
/// <c>settleSeconds</c> (to let a chaotic board settle onto its attractor) and are spaced
/// <c>intervalSeconds</c> apart. Tolerances default to rtol 1e-8 and atol 1e-9 V: tight enough that
/// the solver's error is far below 8-bit quantization.</remarks>
public static class BoardSimulator
{
    /// <summary>Simulates a board.</summary>
    /// <param name="system">The board.</param>
    /// <param name="parameters">Part log-deviations (see <see cref="BoardOdeSystem.ParameterVector"/>).</param>
    /// <param name="initialVolts">The integrator outputs at t = 0.</param>
    /// <param name="settleSeconds">Board time before the first sample, at least 0.</param>
    /// <param name="durationSeconds">The recorded span, positive.</param>
    /// <param name="intervalSeconds">The sample spacing, positive.</param>
    /// <param name="relativeTolerance">The solver's relative tolerance.</param>
    /// <returns>The trace; check <see cref="BoardTrace.Status"/>.</returns>
    public static BoardTrace Simulate(
        BoardOdeSystem system,
        ImmutableArray<double> parameters,
        ImmutableArray<double> initialVolts,
        double settleSeconds,
        double durationSeconds,
        double intervalSeconds,
        double relativeTolerance = 1e-8)
    {
        ArgumentNullException.ThrowIfNull(system);
        Preconditions.CheckArgumentRange(nameof(settleSeconds), settleSeconds >= 0 && double.IsFinite(settleSeconds), "must be a finite time at least 0");
        Preconditions.CheckArgumentRange(nameof(durationSeconds), durationSeconds > 0 && double.IsFinite(durationSeconds), "must be positive");
        Preconditions.CheckArgumentRange(nameof(intervalSeconds), intervalSeconds > 0 && intervalSeconds <= durationSeconds, "must be positive and at most the duration");
        var count = (int)Math.Floor((durationSeconds / intervalSeconds) * (1 + 1e-12)) + 1;
        var times = new double[count];
        for (var k = 0; k < count; k++)
        {
            times[k] = settleSeconds + (k * intervalSeconds);
        }

        var endTime = times[^1];
        var problem = new OdeProblem(system, initialVolts, 0, endTime, parameters);
        var method = new DormandPrince45
        {
            RelativeTolerance = relativeTolerance,
            AbsoluteTolerance = 1e-9,
            SampleTimes = [.. times],
            MaxStep = intervalSeconds * 50,
        };
        var solution = OdeSolver.Solve(problem, method);
        var n = system.StateCount;
        var samples = Math.Min(count, solution.Count);
        var volts = new double[n][];
        for (var j = 0; j < n; j++)
        {
            volts[j] = new double[samples];
        }

        for (var k = 0; k < samples; k++)
        {
            var state = solution.StateAt(k);
            for (var j = 0; j < n; j++)
            {
                volts[j][k] = state[j];
            }
        }

        return new BoardTrace(
            [.. system.StateNames],
            settleSeconds,
            intervalSeconds,
            [.. volts.Select(values => ImmutableArray.Create(values))],
            solution.Status,
            solution.Message);
    }
}

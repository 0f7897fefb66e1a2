using System.Collections.Immutable;
using Patchproof.Core.Circuits.Targets;

namespace Patchproof.Core.Simulation.Synthesis;

/// <summary>Finds the expected range of each model variable by simulating the model with the project's solver.</summary>
/// <remarks>Integrates from the model's default start over [0, settle + span] in problem time and
/// takes max |x_j| over [settle, settle + span], widened by 5 %. For a decaying system (settle 0) the
/// range includes the start.</remarks>
public static class ModelRangeFinder
{
    /// <summary>Simulates the model and returns max |x| per variable.</summary>
    /// <param name="target">The model.</param>
    /// <param name="parameters">Parameter overrides, or null.</param>
    /// <param name="settle">Problem time to skip (transient), at least 0.</param>
    /// <param name="span">Problem time to observe, positive.</param>
    /// <returns>max |x_j| * 1.05 by variable name.</returns>
    public static ImmutableDictionary<string, double> FindRanges(TargetSystem target, IReadOnlyDictionary<string, double>? parameters = null, double settle = 20, double span = 200)
    {
        ArgumentNullException.ThrowIfNull(target);
        Preconditions.CheckArgumentRange(nameof(span), span > 0, "must be positive");
        var problem = new OdeProblem(target.ToOdeSystem(), target.DefaultInitialState, 0, settle + span, target.ParameterVector(parameters));
        var solution = OdeSolver.Solve(problem, new DormandPrince45 { RelativeTolerance = 1e-8, AbsoluteTolerance = 1e-10, SampleInterval = span / 20000 });
        var peaks = new double[target.Variables.Length];
        for (var k = 0; k < solution.Count; k++)
        {
            if (solution.Times[k] < settle)
            {
                continue;
            }

            var state = solution.StateAt(k);
            for (var j = 0; j < peaks.Length; j++)
            {
                peaks[j] = Math.Max(peaks[j], Math.Abs(state[j]));
            }
        }

        return target.Variables.Select((name, j) => (name, j)).ToImmutableDictionary(pair => pair.name, pair => Math.Max(peaks[pair.j], 1e-9) * 1.05, StringComparer.Ordinal);
    }
}

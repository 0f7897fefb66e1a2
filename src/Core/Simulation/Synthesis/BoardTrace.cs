using System.Collections.Immutable;

namespace Patchproof.Core.Simulation.Synthesis;

/// <summary>A simulated board's integrator outputs on a uniform time grid, in volts and seconds.</summary>
/// <remarks>Sample k is at <see cref="StartSeconds"/> + k * <see cref="IntervalSeconds"/> of board time
/// (seconds since the board was started); <see cref="Volts"/>[j][k] is state j there.</remarks>
/// <param name="StateNames">The variables, in state order.</param>
/// <param name="StartSeconds">Board time of the first sample.</param>
/// <param name="IntervalSeconds">The sample spacing, positive.</param>
/// <param name="Volts">One array per state, all of the same length.</param>
/// <param name="Status">How the solver finished.</param>
/// <param name="Message">The solver's message.</param>
public sealed record BoardTrace(
    ImmutableArray<string> StateNames,
    double StartSeconds,
    double IntervalSeconds,
    ImmutableArray<ImmutableArray<double>> Volts,
    SolveStatus Status,
    string Message)
{
    /// <summary>The number of samples.</summary>
    public int SampleCount => Volts.IsDefaultOrEmpty ? 0 : Volts[0].Length;

    /// <summary>Board time of sample k, seconds.</summary>
    /// <param name="index">The sample index.</param>
    /// <returns>Seconds.</returns>
    public double TimeAt(int index) => StartSeconds + (index * IntervalSeconds);
}

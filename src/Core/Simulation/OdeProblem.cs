using System.Collections.Immutable;
using Patchproof.Core.Models;

namespace Patchproof.Core.Simulation;

/// <summary>An initial value problem: a system, its initial state, a time interval and one parameter set.</summary>
/// <remarks>
/// <para>The problem holds data only; any method (<see cref="DormandPrince45"/>, <see cref="RungeKutta4"/>)
/// can solve the same problem without it being edited. Times are in the system's own time unit (problem
/// time for a model, seconds for a board simulation).</para>
/// <para><see cref="EndTime"/> may lie before <see cref="StartTime"/>: the problem is then integrated
/// backwards in time. Equal times give a zero-length solution holding the initial state.</para>
/// <para>Invariants (checked when solving, not here): <see cref="InitialState"/> has
/// <see cref="IOdeSystem.StateCount"/> finite entries, <see cref="Parameters"/> has
/// <see cref="IOdeSystem.ParameterCount"/> entries, and both times are finite.</para>
/// </remarks>
/// <param name="System">The right-hand side dx/dt = f(t, x; p).</param>
/// <param name="InitialState">The state x(t0), one entry per state variable.</param>
/// <param name="StartTime">The initial time t0.</param>
/// <param name="EndTime">The final time t1 (before t0 to integrate backwards).</param>
/// <param name="Parameters">The parameter values p, one entry per system parameter.</param>
public sealed record OdeProblem(
    IOdeSystem System,
    ImmutableArray<double> InitialState,
    double StartTime,
    double EndTime,
    ImmutableArray<double> Parameters)
{
    /// <summary>The signed length of the interval, <c>EndTime - StartTime</c>.</summary>
    public double Duration => EndTime - StartTime;

    /// <summary>Checks the problem's shape and values; throws for a caller's mistake.</summary>
    /// <exception cref="ArgumentOutOfRangeException">When a vector has the wrong length or holds a non-finite value, or a time is not finite.</exception>
    internal void Validate()
    {
        ArgumentNullException.ThrowIfNull(System);
        Preconditions.CheckArgumentRange(nameof(InitialState), !InitialState.IsDefault && InitialState.Length == System.StateCount,
            $"must have {System.StateCount} entries, one per state variable");
        Preconditions.CheckArgumentRange(nameof(Parameters), !Parameters.IsDefault && Parameters.Length == System.ParameterCount,
            $"must have {System.ParameterCount} entries, one per parameter");
        foreach (var value in InitialState)
        {
            Preconditions.CheckFinite(nameof(InitialState), value);
        }

        foreach (var value in Parameters)
        {
            Preconditions.CheckFinite(nameof(Parameters), value);
        }

        Preconditions.CheckFinite(nameof(StartTime), StartTime);
        Preconditions.CheckFinite(nameof(EndTime), EndTime);
    }
}

namespace Patchproof.Core.Simulation;

/// <summary>An event to locate during integration: a zero crossing of g(t, x), or a maximum of one state variable.</summary>
/// <remarks>
/// <para>After each accepted step the event function is compared at the two ends of the step; a sign
/// change in the chosen <see cref="Direction"/> is located by Brent's bracketing root finder on the
/// step's 4th-order dense output, to a time tolerance of about four units in the last place of t.</para>
/// <para>A maximum of x_i is a zero of g = f_i(t, x(t)) = dx_i/dt crossing from + to - (the derivative is
/// evaluated from the system at the interpolated state, which is more accurate than differentiating the
/// interpolant). Successive maxima feed return maps.</para>
/// <para>A <see cref="IsTerminal"/> event stops the integration at the located time with
/// <see cref="SolveStatus.StoppedByEvent"/>. A function that is exactly zero at the start of a step does
/// not fire again for that step.</para>
/// <para>Reference: 1. R. P. Brent, Algorithms for Minimization without Derivatives, Prentice-Hall 1973, ch. 4.
/// 2. L. F. Shampine, I. Gladwell, R. W. Brankin, Reliable solution of special event location problems
/// for ODEs, ACM Trans. Math. Softw. 17 (1991) 11-25.</para>
/// </remarks>
public sealed record OdeEvent
{
    private OdeEvent(EventFunction? function, int stateIndex, EventDirection direction, bool isTerminal)
    {
        Function = function;
        StateIndex = stateIndex;
        Direction = direction;
        IsTerminal = isTerminal;
    }

    /// <summary>The event function g(t, x), or null for a maximum of <see cref="StateIndex"/>.</summary>
    public EventFunction? Function { get; }

    /// <summary>For a maximum event, the index of the state variable; -1 for a zero-crossing event.</summary>
    public int StateIndex { get; }

    /// <summary>Which sign changes count.</summary>
    public EventDirection Direction { get; }

    /// <summary>Whether the integration stops at the first occurrence.</summary>
    public bool IsTerminal { get; }

    /// <summary>Whether this is a maximum of a state variable rather than a zero crossing of a user function.</summary>
    public bool IsMaximum => Function is null;

    /// <summary>An event at the zeros of <paramref name="function"/>.</summary>
    /// <param name="function">The event function g(t, x).</param>
    /// <param name="direction">Which crossings count; default both.</param>
    /// <param name="isTerminal">Whether to stop at the first occurrence.</param>
    /// <returns>The event.</returns>
    public static OdeEvent ZeroCrossing(EventFunction function, EventDirection direction = EventDirection.Any, bool isTerminal = false)
    {
        ArgumentNullException.ThrowIfNull(function);
        return new OdeEvent(function, -1, direction, isTerminal);
    }

    /// <summary>An event at each local maximum of state variable <paramref name="stateIndex"/>.</summary>
    /// <param name="stateIndex">The state index, 0 to n - 1 (checked when solving).</param>
    /// <param name="isTerminal">Whether to stop at the first maximum.</param>
    /// <returns>The event.</returns>
    /// <exception cref="ArgumentOutOfRangeException">When <paramref name="stateIndex"/> is negative.</exception>
    public static OdeEvent MaximumOf(int stateIndex, bool isTerminal = false)
    {
        Preconditions.CheckArgumentRange(nameof(stateIndex), stateIndex >= 0, "must be at least 0");
        return new OdeEvent(null, stateIndex, EventDirection.Falling, isTerminal);
    }
}

namespace Patchproof.Core.Simulation;

/// <summary>An event function g(t, x); an event occurs where it changes sign.</summary>
/// <param name="time">The time t.</param>
/// <param name="state">The state x(t) (length n); valid only during the call.</param>
/// <returns>The value g(t, x), in any unit; only its sign and zeros matter.</returns>
public delegate double EventFunction(double time, ReadOnlySpan<double> state);

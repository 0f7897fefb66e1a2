namespace Patchproof.Core.Models;

/// <summary>A first-order system of ordinary differential equations dx/dt = f(t, x; p), evaluated without allocating.</summary>
/// <remarks>
/// <para>Units are whatever the system is written in: problem units and problem time for a model,
/// volts and seconds for a board simulation. The state vector has <see cref="StateCount"/> entries
/// and the parameter vector <see cref="ParameterCount"/>; both are passed on every call so one
/// compiled system serves many parameter sets (the estimator changes them thousands of times).</para>
/// <para>Jacobians are dense and row-major: entry (i, j) sits at <c>i * columns + j</c>.</para>
/// <para>Implementations must be safe to call from several threads at once with distinct buffers,
/// and must not allocate in <see cref="Evaluate"/> or either Jacobian.</para>
/// </remarks>
public interface IOdeSystem
{
    /// <summary>The number of state variables n (at least 1).</summary>
    int StateCount { get; }

    /// <summary>The number of parameters m (0 or more).</summary>
    int ParameterCount { get; }

    /// <summary>The state names in order, for example <c>x, y, z</c>.</summary>
    IReadOnlyList<string> StateNames { get; }

    /// <summary>The parameter names in order, for example <c>sigma, rho, beta</c>.</summary>
    IReadOnlyList<string> ParameterNames { get; }

    /// <summary>Writes f(t, x; p) into <paramref name="derivative"/> (length n).</summary>
    /// <param name="time">The independent variable t.</param>
    /// <param name="state">The state x (length n).</param>
    /// <param name="parameters">The parameters p (length m).</param>
    /// <param name="derivative">Receives dx/dt (length n).</param>
    void Evaluate(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> derivative);

    /// <summary>Writes the state Jacobian df/dx, n by n row-major, into <paramref name="jacobian"/>.</summary>
    /// <param name="time">The independent variable t.</param>
    /// <param name="state">The state x (length n).</param>
    /// <param name="parameters">The parameters p (length m).</param>
    /// <param name="jacobian">Receives df_i/dx_j at <c>i * n + j</c> (length n * n).</param>
    void EvaluateStateJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian);

    /// <summary>Writes the parameter Jacobian df/dp, n by m row-major, into <paramref name="jacobian"/>.</summary>
    /// <param name="time">The independent variable t.</param>
    /// <param name="state">The state x (length n).</param>
    /// <param name="parameters">The parameters p (length m).</param>
    /// <param name="jacobian">Receives df_i/dp_k at <c>i * m + k</c> (length n * m).</param>
    void EvaluateParameterJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian);
}

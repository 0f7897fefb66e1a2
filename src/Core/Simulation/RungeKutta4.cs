namespace Patchproof.Core.Simulation;

/// <summary>Options for the classical fixed-step fourth-order Runge-Kutta method, kept for comparison.</summary>
/// <remarks>
/// <para>Every step has magnitude <see cref="Step"/> (in the system's time unit) except the last, which is
/// shortened to end exactly at the end time. There is no error control, dense output, event location or
/// sensitivity integration; the solution holds the state at every step.</para>
/// <para>Reference: 1. E. Hairer, S. P. Nørsett, G. Wanner, Solving Ordinary Differential Equations I,
/// 2nd ed., Springer 1993, Sec. II.1 (Kutta 1901).</para>
/// </remarks>
public sealed record RungeKutta4 : OdeMethod
{
    /// <summary>The step magnitude h (positive, finite; default 0.01).</summary>
    public double Step { get; init; } = 0.01;

    /// <inheritdoc />
    internal override void Validate()
    {
        base.Validate();
        Preconditions.CheckArgumentRange(nameof(Step), Step > 0 && double.IsFinite(Step), "must be a positive finite number");
    }
}

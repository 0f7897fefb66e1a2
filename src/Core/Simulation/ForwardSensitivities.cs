namespace Patchproof.Core.Simulation;

/// <summary>Asks the solver to integrate the forward sensitivities dx/dx0 and dx/dp with the state.</summary>
/// <remarks>
/// <para>The variational equations are S_x' = J S_x with S_x(t0) = I (n by n) and S_p' = J S_p + F_p
/// with S_p(t0) = 0 (n by m), where J = df/dx and F_p = df/dp come from the system's Jacobians. They are
/// integrated by the same Runge-Kutta steps as the state, so the sensitivities are the exact derivatives
/// of the discrete solution for fixed steps (internal differentiation).</para>
/// <para>Both matrices are row-major: entry (i, j) of S_x is dx_i(t)/dx0_j at <c>i * n + j</c>, entry
/// (i, k) of S_p is dx_i(t)/dp_k at <c>i * m + k</c>.</para>
/// <para>Reference: 1. E. Hairer, S. P. Nørsett, G. Wanner, Solving Ordinary Differential Equations I,
/// 2nd ed., Springer 1993, Sec. I.14 and II.6 (internal differentiation).</para>
/// </remarks>
public sealed record ForwardSensitivities
{
    /// <summary>Whether the sensitivity components take part in the step-size control; default false
    /// (only the state decides the step, which is cheaper and what multiple shooting needs).</summary>
    public bool IncludeInErrorControl { get; init; }
}

namespace Patchproof.Core.Estimation;

/// <summary>Writes the residuals r(p) of a least-squares problem.</summary>
/// <param name="parameters">The unknowns p.</param>
/// <param name="residuals">Receives r_i(p), one per observation; NaN or infinity marks a point where the model is undefined.</param>
public delegate void ResidualFunction(ReadOnlySpan<double> parameters, Span<double> residuals);

/// <summary>Writes the Jacobian dr/dp of a least-squares problem, observations by unknowns, row-major.</summary>
/// <param name="parameters">The unknowns p.</param>
/// <param name="jacobian">Receives dr_i/dp_j at <c>i * parameterCount + j</c>.</param>
public delegate void JacobianFunction(ReadOnlySpan<double> parameters, Span<double> jacobian);

/// <summary>An ordinary (dense) nonlinear least-squares problem: minimise sum_i r_i(p)^2.</summary>
/// <remarks>
/// <para>For weighted curve fitting write r_i = (y_i - f(x_i; p)) / sigma_i. The Jacobian is optional; without it
/// <see cref="LevenbergMarquardtFitter"/> uses finite differences. Residual and Jacobian functions are called with
/// buffers owned by the fitter and must not keep them.</para>
/// </remarks>
/// <param name="ObservationCount">The number of residuals n, at least <paramref name="ParameterCount"/>.</param>
/// <param name="ParameterCount">The number of unknowns p, at least 1.</param>
/// <param name="Residuals">Computes r(p).</param>
/// <param name="Jacobian">Computes dr/dp, or null for finite differences.</param>
public sealed record NonlinearLeastSquaresProblem(int ObservationCount, int ParameterCount, ResidualFunction Residuals, JacobianFunction? Jacobian = null);

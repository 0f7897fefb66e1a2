namespace Patchproof.Core.Models.Library;

/// <summary>The Lorenz system, written by hand: x' = sigma (y - x), y' = x (rho - z) - y, z' = x y - beta z.</summary>
/// <remarks>
/// <para>Parameters (sigma, rho, beta), published values 10, 28, 8/3. The performance reference and
/// cross-check for the compiled text of <see cref="ModelCatalog.Lorenz"/>.</para>
/// <para>References: 1. E. N. Lorenz, "Deterministic nonperiodic flow", J. Atmos. Sci. 20(2):130-141
/// (1963), doi:10.1175/1520-0469(1963)020&lt;0130:DNF&gt;2.0.CO;2.</para>
/// </remarks>
public sealed class LorenzSystem : IOdeSystem
{
    /// <inheritdoc />
    public int StateCount => 3;

    /// <inheritdoc />
    public int ParameterCount => 3;

    /// <inheritdoc />
    public IReadOnlyList<string> StateNames { get; } = ["x", "y", "z"];

    /// <inheritdoc />
    public IReadOnlyList<string> ParameterNames { get; } = ["sigma", "rho", "beta"];

    /// <inheritdoc />
    public void Evaluate(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> derivative)
    {
        // Highest index first: one bounds check per span instead of three.
        double z = state[2], y = state[1], x = state[0];
        double beta = parameters[2], rho = parameters[1], sigma = parameters[0];
        derivative[2] = (x * y) - (beta * z);
        derivative[1] = (x * (rho - z)) - y;
        derivative[0] = sigma * (y - x);
    }

    /// <inheritdoc />
    public void EvaluateStateJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        double x = state[0], y = state[1], z = state[2];
        double sigma = parameters[0], rho = parameters[1], beta = parameters[2];
        jacobian[8] = -beta;
        jacobian[0] = -sigma;
        jacobian[1] = sigma;
        jacobian[2] = 0;
        jacobian[3] = rho - z;
        jacobian[4] = -1;
        jacobian[5] = -x;
        jacobian[6] = y;
        jacobian[7] = x;
    }

    /// <inheritdoc />
    public void EvaluateParameterJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        double x = state[0], y = state[1], z = state[2];
        jacobian[8] = -z;
        jacobian[0] = y - x;
        jacobian[1] = 0;
        jacobian[2] = 0;
        jacobian[3] = 0;
        jacobian[4] = x;
        jacobian[5] = 0;
        jacobian[6] = 0;
        jacobian[7] = 0;
    }
}

namespace Patchproof.Core.Models.Library;

/// <summary>Chua's circuit in dimensionless form, written by hand: x' = alpha (y - x - g(x)), y' = x - y + z, z' = -beta y.</summary>
/// <remarks>
/// <para>Chua's diode is the piecewise-linear g(x) = m1 x + (m0 - m1)(|x + 1| - |x - 1|)/2: slope m0
/// inside [-1, 1] and m1 outside. Parameters (alpha, beta) = (15.6, 28); the slopes are fixed
/// constants m0 = -8/7, m1 = -5/7. This set gives the double-scroll attractor.</para>
/// <para>Exactly at a breakpoint the state Jacobian uses the slope on the right (m0 at x = -1, m1 at x = 1), as compiled models do.</para>
/// <para>References: 1. The dimensionless equations x' = a(-x + y - f(x)), y' = x - y + z,
/// z' = -b y with f(x) = m1 x + 0.5 (m0 - m1)(|x + 1| - |x - 1|): M. Biey, teaching notes on
/// Chua's oscillator, Politecnico di Torino (web page), after Chua, Komuro and Matsumoto. 2. The
/// values alpha = 15.6, beta = 28, m0 = -1.143, m1 = -0.714 as listed on public demonstration pages;
/// the exact fractions -8/7 and -5/7 and their origin in L. O. Chua, M. Komuro, T. Matsumoto, "The
/// double scroll family", IEEE Trans. Circuits Syst. 33(11):1072-1118 (1986) are from memory.</para>
/// </remarks>
public sealed class ChuaSystem : IOdeSystem
{
    /// <summary>The inner slope of the diode, m0 = -8/7 (from memory; -1.143 published).</summary>
    public const double InnerSlope = -8.0 / 7.0;

    /// <summary>The outer slope of the diode, m1 = -5/7 (from memory; -0.714 published).</summary>
    public const double OuterSlope = -5.0 / 7.0;

    /// <inheritdoc />
    public int StateCount => 3;

    /// <inheritdoc />
    public int ParameterCount => 2;

    /// <inheritdoc />
    public IReadOnlyList<string> StateNames { get; } = ["x", "y", "z"];

    /// <inheritdoc />
    public IReadOnlyList<string> ParameterNames { get; } = ["alpha", "beta"];

    /// <summary>Chua's diode g(x) = m1 x + (m0 - m1)(|x + 1| - |x - 1|)/2.</summary>
    /// <param name="x">The dimensionless voltage.</param>
    public static double Diode(double x) => (OuterSlope * x) + (0.5 * (InnerSlope - OuterSlope) * (Math.Abs(x + 1) - Math.Abs(x - 1)));

    /// <inheritdoc />
    public void Evaluate(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> derivative)
    {
        double x = state[0], y = state[1], z = state[2];
        double alpha = parameters[0], beta = parameters[1];
        derivative[2] = -beta * y;
        derivative[0] = alpha * (y - x - Diode(x));
        derivative[1] = x - y + z;
    }

    /// <inheritdoc />
    public void EvaluateStateJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        var x = state[0];
        double alpha = parameters[0], beta = parameters[1];
        var slope = x >= -1 && x < 1 ? InnerSlope : OuterSlope;
        jacobian[8] = 0;
        jacobian[0] = -alpha * (1 + slope);
        jacobian[1] = alpha;
        jacobian[2] = 0;
        jacobian[3] = 1;
        jacobian[4] = -1;
        jacobian[5] = 1;
        jacobian[6] = 0;
        jacobian[7] = -beta;
    }

    /// <inheritdoc />
    public void EvaluateParameterJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        double x = state[0], y = state[1];
        jacobian[5] = -y;
        jacobian[0] = y - x - Diode(x);
        jacobian[1] = 0;
        jacobian[2] = 0;
        jacobian[3] = 0;
        jacobian[4] = 0;
    }
}

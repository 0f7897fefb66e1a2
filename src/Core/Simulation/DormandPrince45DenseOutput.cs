using System.Runtime.CompilerServices;
namespace Patchproof.Core.Simulation;

/// <summary>Shampine's 4th-order continuous extension of one Dormand-Prince step.</summary>
/// <remarks>
/// <para>For a step from (t0, y0) to (t0 + h, y1) with stages K_1..K_7, θ = (t - t0) / h, and the
/// coefficient vectors r1 = y0, r2 = y1 - y0, r3 = h K_1 - r2, r4 = r2 - h K_7 - r3, r5 = h Σ d_i K_i
/// (d the last column of <see cref="ButcherTableau.P"/>), the interpolant is
/// y(t) = r1 + θ (r2 + (1 - θ)(r3 + θ (r4 + (1 - θ) r5))).
/// It matches y0 and y1 and the slopes K_1 and K_7 at both ends, and is 4th-order accurate inside.</para>
/// <para>The coefficients are stored as 5 blocks of <see cref="Dimension"/> values.</para>
/// <para>References:
/// 1. L. F. Shampine, Some practical Runge-Kutta formulas, Math. Comp. 46(173) (1986) 135-150.
/// 2. E. Hairer, S. P. Nørsett, G. Wanner, Solving Ordinary Differential Equations I, 2nd ed., Springer 1993, Sec. II.6 and code DOPRI5 (CONTD5).</para>
/// </remarks>
public sealed class DormandPrince45DenseOutput : IDenseOutput
{
    private readonly double[] coefficients;
    private readonly double startTime;
    private readonly double stepSize;

    /// <summary>Creates the interpolant from its coefficients.</summary>
    /// <param name="startTime">The step's start t0.</param>
    /// <param name="stepSize">The signed step h (negative backwards in time, not zero).</param>
    /// <param name="coefficients">r1..r5, each of <paramref name="dimension"/> values (copied).</param>
    /// <param name="dimension">The number of components N.</param>
    /// <exception cref="ArgumentOutOfRangeException">When the coefficient count is not 5 N or the step is zero.</exception>
    public DormandPrince45DenseOutput(double startTime, double stepSize, ReadOnlySpan<double> coefficients, int dimension)
    {
        Preconditions.CheckArgumentRange(nameof(dimension), dimension >= 1, "must be at least 1");
        Preconditions.CheckArgumentRange(nameof(coefficients), coefficients.Length == 5 * dimension, "must hold 5 blocks of the dimension");
        Preconditions.CheckArgumentRange(nameof(stepSize), stepSize != 0 && double.IsFinite(stepSize), "must be finite and not zero");
        this.startTime = startTime;
        this.stepSize = stepSize;
        this.coefficients = coefficients.ToArray();
        Dimension = dimension;
        TMin = Math.Min(startTime, startTime + stepSize);
        TMax = Math.Max(startTime, startTime + stepSize);
    }

    /// <summary>The number of components N.</summary>
    public int Dimension { get; }

    /// <inheritdoc />
    public double TMin { get; }

    /// <inheritdoc />
    public double TMax { get; }

    /// <inheritdoc />
    public void Evaluate(double time, Span<double> destination) => Interpolate(coefficients, Dimension, (time - startTime) / stepSize, destination);

    /// <summary>Writes r1..r5 for one step into <paramref name="coefficients"/> (5 N values).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static void ComputeCoefficients(
        double stepSize,
        ReadOnlySpan<double> y0,
        ReadOnlySpan<double> y1,
        ReadOnlySpan<double> k1,
        ReadOnlySpan<double> k3,
        ReadOnlySpan<double> k4,
        ReadOnlySpan<double> k5,
        ReadOnlySpan<double> k6,
        ReadOnlySpan<double> k7,
        in DenseWeights d,
        Span<double> coefficients)
    {
        var n = y0.Length;
        var r1 = coefficients[..n];
        var r2 = coefficients.Slice(n, n);
        var r3 = coefficients.Slice(2 * n, n);
        var r4 = coefficients.Slice(3 * n, n);
        var r5 = coefficients.Slice(4 * n, n);
        y1 = y1[..n];
        k1 = k1[..n];
        k3 = k3[..n];
        k4 = k4[..n];
        k5 = k5[..n];
        k6 = k6[..n];
        k7 = k7[..n];
        for (var i = 0; i < n; i++)
        {
            var difference = y1[i] - y0[i];
            var bSlope = (stepSize * k1[i]) - difference;
            r1[i] = y0[i];
            r2[i] = difference;
            r3[i] = bSlope;
            r4[i] = difference - (stepSize * k7[i]) - bSlope;
            r5[i] = stepSize * ((d.D1 * k1[i]) + (d.D3 * k3[i]) + (d.D4 * k4[i]) + (d.D5 * k5[i]) + (d.D6 * k6[i]) + (d.D7 * k7[i]));
        }
    }

    /// <summary>Evaluates the interpolant with coefficients r1..r5 at θ.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static void Interpolate(ReadOnlySpan<double> coefficients, int dimension, double theta, Span<double> destination)
    {
        var count = destination.Length;
        var r1 = coefficients[..count];
        var r2 = coefficients.Slice(dimension, count);
        var r3 = coefficients.Slice(2 * dimension, count);
        var r4 = coefficients.Slice(3 * dimension, count);
        var r5 = coefficients.Slice(4 * dimension, count);
        var oneMinusTheta = 1.0 - theta;
        for (var i = 0; i < count; i++)
        {
            destination[i] = r1[i] + (theta * (r2[i] + (oneMinusTheta * (r3[i] + (theta * (r4[i] + (oneMinusTheta * r5[i])))))));
        }
    }

    /// <summary>The dense-output weights d_i (the θ^4 column of P) for the stages that carry them (d_2 = 0).</summary>
    internal readonly record struct DenseWeights(double D1, double D3, double D4, double D5, double D6, double D7);
}

using System.Collections.Immutable;

namespace Patchproof.Core.Simulation;

/// <summary>The Dormand-Prince 5(4) tableau (DOPRI5) with Shampine's 4th-order dense output.</summary>
/// <remarks>
/// <para>Seven stages, first same as last: the seventh stage is f(t + h, y1), reused as the first stage of
/// the next step, so an accepted step costs six evaluations. Order 5 with an embedded order-4 error
/// estimate; e = b - b̂ follows Hairer's sign convention (SciPy stores -e; the norm is the same).</para>
/// <para>Every coefficient is written as the quotient of two exact integers, so each double is the
/// correctly rounded value of the published rational.</para>
/// <para>The dense output P (powers θ^1..θ^4) equals Hairer's CONTD5 form
/// y(θ) = r1 + θ(r2 + (1-θ)(r3 + θ(r4 + (1-θ) r5))) with r5 = h Σ d_i K_i, d being P's last column.</para>
/// <para>References:
/// 1. J. R. Dormand, P. J. Prince, A family of embedded Runge-Kutta formulae, J. Comput. Appl. Math. 6(1) (1980) 19-26.
/// 2. E. Hairer, S. P. Nørsett, G. Wanner, Solving Ordinary Differential Equations I, 2nd ed., Springer 1993, Sec. II.5 Table 5.2 and II.6; code DOPRI5 (CDOPRI, CONTD5).
/// 3. L. F. Shampine, Some practical Runge-Kutta formulas, Math. Comp. 46(173) (1986) 135-150 (the dense output).</para>
/// </remarks>
public static class DormandPrince45Tableau
{
    /// <summary>The shared immutable tableau.</summary>
    public static ButcherTableau Instance { get; } = Create();

    // The coefficients as constants, so that the stepper's stage loops fold them into the code (fields
    // would be reloaded from memory in every loop iteration, since stores through refs may alias them).
    internal const double A21 = 1.0 / 5.0;
    internal const double A31 = 3.0 / 40.0, A32 = 9.0 / 40.0;
    internal const double A41 = 44.0 / 45.0, A42 = -56.0 / 15.0, A43 = 32.0 / 9.0;
    internal const double A51 = 19372.0 / 6561.0, A52 = -25360.0 / 2187.0, A53 = 64448.0 / 6561.0, A54 = -212.0 / 729.0;
    internal const double A61 = 9017.0 / 3168.0, A62 = -355.0 / 33.0, A63 = 46732.0 / 5247.0, A64 = 49.0 / 176.0, A65 = -5103.0 / 18656.0;
    internal const double B1 = 35.0 / 384.0, B3 = 500.0 / 1113.0, B4 = 125.0 / 192.0, B5 = -2187.0 / 6784.0, B6 = 11.0 / 84.0;
    internal const double C2 = 1.0 / 5.0, C3 = 3.0 / 10.0, C4 = 4.0 / 5.0, C5 = 8.0 / 9.0;
    internal const double E1 = 71.0 / 57600.0, E3 = -71.0 / 16695.0, E4 = 71.0 / 1920.0, E5 = -17253.0 / 339200.0, E6 = 22.0 / 525.0, E7 = -1.0 / 40.0;

    private static ButcherTableau Create()
    {
        ImmutableArray<ImmutableArray<double>> a =
        [
            [],
            [A21],
            [A31, A32],
            [A41, A42, A43],
            [A51, A52, A53, A54],
            [A61, A62, A63, A64, A65],
            [B1, 0.0, B3, B4, B5, B6],
        ];
        ImmutableArray<double> b = [B1, 0.0, B3, B4, B5, B6, 0.0];
        ImmutableArray<double> c = [0.0, C2, C3, C4, C5, 1.0, 1.0];
        ImmutableArray<double> e = [E1, 0.0, E3, E4, E5, E6, E7];
        ImmutableArray<ImmutableArray<double>> p =
        [
            [1.0, -8048581381.0 / 2820520608.0, 8663915743.0 / 2820520608.0, -12715105075.0 / 11282082432.0],
            [0.0, 0.0, 0.0, 0.0],
            [0.0, 131558114200.0 / 32700410799.0, -68118460800.0 / 10900136933.0, 87487479700.0 / 32700410799.0],
            [0.0, -1754552775.0 / 470086768.0, 14199869525.0 / 1410260304.0, -10690763975.0 / 1880347072.0],
            [0.0, 127303824393.0 / 49829197408.0, -318862633887.0 / 49829197408.0, 701980252875.0 / 199316789632.0],
            [0.0, -282668133.0 / 205662961.0, 2019193451.0 / 616988883.0, -1453857185.0 / 822651844.0],
            [0.0, 40617522.0 / 29380423.0, -110615467.0 / 29380423.0, 69997945.0 / 29380423.0],
        ];
        return new ButcherTableau(a, b, c, e, p, order: 5, errorEstimatorOrder: 4);
    }
}

namespace Patchproof.Core.Simulation;

/// <summary>A scalar function for the root finder; a struct so the call is inlined and allocation-free.</summary>
internal interface IScalarFunction
{
    /// <summary>The function value at <paramref name="x"/>.</summary>
    double Evaluate(double x);
}

/// <summary>Brent's bracketing root finder (zeroin): inverse quadratic interpolation with bisection as a safeguard.</summary>
/// <remarks>
/// <para>Given f(a) and f(b) of opposite signs (or one zero), returns b with a sign change of f within
/// 2 eps |b| + tolerance of it. Convergence is guaranteed; at most 200 iterations.</para>
/// <para>Reference: 1. R. P. Brent, Algorithms for Minimization without Derivatives, Prentice-Hall 1973, ch. 4 (zero).</para>
/// </remarks>
internal static class BrentRootFinder
{
    /// <summary>The spacing of doubles at 1.</summary>
    public const double MachineEpsilon = 2.220446049250313e-16;

    public static double FindRoot<TFunction>(ref TFunction function, double a, double b, double fa, double fb, double tolerance)
        where TFunction : struct, IScalarFunction
    {
        if (fa == 0)
        {
            return a;
        }

        if (fb == 0)
        {
            return b;
        }

        var c = a;
        var fc = fa;
        var d = b - a;
        var e = d;
        for (var iteration = 0; iteration < 200; iteration++)
        {
            if ((fb > 0 && fc > 0) || (fb < 0 && fc < 0))
            {
                c = a;
                fc = fa;
                d = b - a;
                e = d;
            }

            if (Math.Abs(fc) < Math.Abs(fb))
            {
                (a, b, c) = (b, c, b);
                (fa, fb, fc) = (fb, fc, fb);
            }

            var tol = (2.0 * MachineEpsilon * Math.Abs(b)) + (0.5 * tolerance) + double.Epsilon;
            var m = 0.5 * (c - b);
            if (Math.Abs(m) <= tol || fb == 0)
            {
                return b;
            }

            if (Math.Abs(e) < tol || Math.Abs(fa) <= Math.Abs(fb))
            {
                d = m;
                e = m;
            }
            else
            {
                var s = fb / fa;
                double p, q;
                if (a == c)
                {
                    p = 2.0 * m * s;
                    q = 1.0 - s;
                }
                else
                {
                    var qa = fa / fc;
                    var r = fb / fc;
                    p = s * ((2.0 * m * qa * (qa - r)) - ((b - a) * (r - 1.0)));
                    q = (qa - 1.0) * (r - 1.0) * (s - 1.0);
                }

                if (p > 0)
                {
                    q = -q;
                }
                else
                {
                    p = -p;
                }

                if (2.0 * p < (3.0 * m * q) - Math.Abs(tol * q) && p < Math.Abs(0.5 * e * q))
                {
                    e = d;
                    d = p / q;
                }
                else
                {
                    d = m;
                    e = m;
                }
            }

            a = b;
            fa = fb;
            b += Math.Abs(d) > tol ? d : (m > 0 ? tol : -tol);
            fb = function.Evaluate(b);
        }

        return b;
    }
}

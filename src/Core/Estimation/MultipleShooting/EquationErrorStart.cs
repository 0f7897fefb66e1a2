using MathNet.Numerics.LinearAlgebra;

namespace Patchproof.Core.Estimation.MultipleShooting;

/// <summary>Starting values for multiple shooting from the equation-error regression: every coefficient, every
/// equation offset and every channel offset the data resolve, in closed form.</summary>
/// <remarks>
/// <para>A channel reads y_a = V_a + d_a. A product term then becomes (y_a - d_a)(y_b - d_b) = y_a y_b - d_b y_a -
/// d_a y_b + d_a d_b, so each equation is regressed on an extended basis: its design terms, the linear term of every
/// state inside one of its products, and a constant. The estimates stay linear. A linear term the design lacks
/// carries beta_{j,a} = -Σ_p theta_p d_(partner of a in p) only, which gives one linear equation in the offsets d;
/// they are solved together by a rank-aware SVD, and a direction the data cannot resolve (an offset that trades
/// exactly against a coefficient, as the z offset of a Lorenz board does) is set to zero, the prior mean of the fit.
/// The design's linear coefficients and the constants then follow: theta_{j,a} = beta_{j,a} + Σ_p theta_p
/// d_partner, b_j = beta_{j,1} + Σ_a theta_{j,a} d_a - Σ_p theta_p d_a d_b.</para>
/// <para>Only terms of degree at most two take part in the offset recovery; a model with higher powers starts with
/// zero channel offsets.</para>
/// <para>Reference: H. U. Voss, J. Timmer, J. Kurths, Nonlinear dynamical system identification from uncertain and
/// indirect measurements, Int. J. Bifurcation Chaos 14 (2004) 1905-1933 (equation-error starts for shooting).</para>
/// </remarks>
public static class EquationErrorStart
{
    /// <summary>Estimates the field's parameters and the channel offsets from fully recorded states.</summary>
    /// <param name="field">The vector field; its parameter order is kept.</param>
    /// <param name="states">One array per state: the channel divided by its nominal gain (offsets not removed).</param>
    /// <param name="sampleInterval">h, in the field's time unit.</param>
    /// <param name="options">Filter, window (in the field's time unit), batches and mask of the regression.</param>
    /// <returns>The start, or null when the regression cannot run or gives non-finite values.</returns>
    public static EquationErrorStartResult? TryEstimate(PolynomialVectorField field, IReadOnlyList<double[]> states, double sampleInterval, EquationErrorOptions options)
    {
        ArgumentNullException.ThrowIfNull(field);
        ArgumentNullException.ThrowIfNull(states);
        ArgumentNullException.ThrowIfNull(options);
        var n = field.StateCount;
        Preconditions.CheckArgumentRange(nameof(states), states.Count == n, "needs one array per state");
        var quadratic = field.Terms.All(term => term.Factors.Count <= 2);

        // Per equation: the design's non-constant terms, then the extra linear terms the offsets create.
        var designTerms = new List<int>[n];
        var extraLinear = new List<int>[n];
        var equations = new List<IReadOnlyList<RegressionTerm>>(n);
        for (var j = 0; j < n; j++)
        {
            designTerms[j] = Enumerable.Range(0, field.TermCount).Where(t => field.Terms[t].Equation == j && field.Terms[t].Factors.Count > 0).ToList();
            var linear = designTerms[j].Where(t => field.Terms[t].Factors.Count == 1).Select(t => field.Terms[t].Factors[0]).ToHashSet();
            extraLinear[j] = !quadratic ? [] : designTerms[j].Where(t => field.Terms[t].Factors.Count == 2).SelectMany(t => field.Terms[t].Factors)
                .Distinct().Where(a => !linear.Contains(a)).Order().ToList();
            equations.Add(designTerms[j].Select(t => new RegressionTerm(field.Terms[t].Label, field.Terms[t].Factors))
                .Concat(extraLinear[j].Select(a => new RegressionTerm(field.StateNames[a], [a]))).ToList());
        }

        EquationErrorResult regression;
        try
        {
            regression = EquationErrorRegression.Fit(states, sampleInterval, equations, options with { IncludeConstant = true });
        }
        catch (ArgumentOutOfRangeException)
        {
            return null;
        }

        double Beta(int j, int k) => regression.Equations[j].Coefficients[k];

        // Offsets: beta_{j,a} = -Σ_p theta_p d_partner over the products p of equation j that contain a.
        var rows = new List<(double[] Row, double Value)>();
        for (var j = 0; j < n && quadratic; j++)
        {
            for (var e = 0; e < extraLinear[j].Count; e++)
            {
                var a = extraLinear[j][e];
                var row = new double[n];
                foreach (var (t, k) in designTerms[j].Select((t, k) => (t, k)))
                {
                    AddPartnerCoefficients(field.Terms[t].Factors, a, Beta(j, k), row);
                }

                rows.Add((row, -Beta(j, designTerms[j].Count + e)));
            }
        }

        var offsets = SolveRankAware(rows, n);

        var parameters = new double[field.ParameterCount];
        for (var j = 0; j < n; j++)
        {
            var constant = Beta(j, equations[j].Count);
            for (var k = 0; k < designTerms[j].Count; k++)
            {
                var factors = field.Terms[designTerms[j][k]].Factors;
                var theta = Beta(j, k);
                if (factors.Count == 1)
                {
                    // theta_{j,a} = beta_{j,a} + Σ_p theta_p d_partner; the constant gains theta_{j,a} d_a.
                    var row = new double[n];
                    for (var q = 0; q < designTerms[j].Count; q++)
                    {
                        AddPartnerCoefficients(field.Terms[designTerms[j][q]].Factors, factors[0], Beta(j, q), row);
                    }

                    theta += row.Select((w, b) => w * offsets[b]).Sum();
                    constant += theta * offsets[factors[0]];
                }
                else if (factors.Count == 2)
                {
                    constant -= theta * offsets[factors[0]] * offsets[factors[1]];
                }

                parameters[designTerms[j][k]] = theta;
            }

            var constantTerm = Enumerable.Range(0, field.TermCount).FirstOrDefault(t => field.Terms[t].Equation == j && field.Terms[t].Factors.Count == 0, -1);
            var offsetSlot = field.OffsetEquations.ToList().IndexOf(j);
            if (constantTerm >= 0)
            {
                parameters[constantTerm] = constant;
            }
            else if (offsetSlot >= 0)
            {
                parameters[field.TermCount + offsetSlot] = constant;
            }
        }

        if (!parameters.All(double.IsFinite) || !offsets.All(double.IsFinite))
        {
            return null;
        }

        return new EquationErrorStartResult(parameters, offsets, regression.HalfWidth, regression.PolynomialOrder, regression.Equations.Select(e => e.RSquared).ToArray());
    }

    /// <summary>Adds, for a product containing state <paramref name="a"/>, theta times the offset of a's partner (twice
    /// for a square) to <paramref name="row"/>: the term's contribution to the coefficient of y_a per unit of offset.</summary>
    private static void AddPartnerCoefficients(IReadOnlyList<int> factors, int a, double theta, double[] row)
    {
        if (factors.Count != 2)
        {
            return;
        }

        if (factors[0] == a)
        {
            row[factors[1]] += theta;
        }

        if (factors[1] == a)
        {
            row[factors[0]] += theta;
        }
    }

    private static double[] SolveRankAware(List<(double[] Row, double Value)> rows, int n)
    {
        if (rows.Count == 0)
        {
            return new double[n];
        }

        var matrix = Matrix<double>.Build.Dense(rows.Count, n, (r, c) => rows[r].Row[c]);
        var values = Vector<double>.Build.Dense(rows.Count, r => rows[r].Value);
        var svd = matrix.Svd(true);
        var singular = svd.S;
        var largest = singular.Count > 0 ? singular.Maximum() : 0;
        var solution = Vector<double>.Build.Dense(n);
        var projected = svd.U.TransposeThisAndMultiply(values);
        for (var i = 0; i < singular.Count; i++)
        {
            if (singular[i] > 1e-9 * largest && largest > 0)
            {
                solution += svd.VT.Row(i) * (projected[i] / singular[i]);
            }
        }

        return solution.ToArray();
    }
}

/// <summary>Equation-error starting values for multiple shooting.</summary>
/// <param name="Parameters">The field's parameters, in its order (term coefficients, then equation offsets).</param>
/// <param name="StateOffsets">Each state's channel offset in state units (the channel's offset over its nominal gain); zero along directions the data cannot resolve.</param>
/// <param name="FilterHalfWidth">The Savitzky-Golay half-width used.</param>
/// <param name="FilterOrder">The Savitzky-Golay order used.</param>
/// <param name="RSquared">Each equation's explained fraction of the derivative's variance.</param>
public sealed record EquationErrorStartResult(IReadOnlyList<double> Parameters, IReadOnlyList<double> StateOffsets, int FilterHalfWidth, int FilterOrder, IReadOnlyList<double> RSquared);

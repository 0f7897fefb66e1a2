using Patchproof.Core.Models;

namespace Patchproof.Core.Estimation.MultipleShooting;

/// <summary>One coefficient-times-basis term of a polynomial vector field: theta · V_a · V_b · … in equation <see cref="Equation"/>.</summary>
/// <param name="Equation">The index of the state whose derivative the term feeds.</param>
/// <param name="Factors">The state indices multiplied together to form the basis; empty for a constant, two for a product.</param>
/// <param name="Label">A display text for the basis, for example <c>x*z</c>.</param>
public sealed record PolynomialTerm(int Equation, IReadOnlyList<int> Factors, string Label);

/// <summary>The right-hand side the estimator fits: dV_j/dt = Σ_t theta_t φ_t(V) + b_j, linear in its coefficients.</summary>
/// <remarks>
/// <para>Every board equation is a sum of coefficient-times-basis terms where each basis φ_t is a product of state
/// voltages (a state, a product of two, or 1), plus an offset b_j collecting integrator offset drift. In the
/// board's machine units the states are volts and time is seconds, so theta has units 1/s (times 1/V per extra
/// factor) and b_j volts per second.</para>
/// <para>The parameter vector is the term coefficients in <see cref="Terms"/> order, followed by one offset for
/// each equation flagged in <see cref="HasOffset"/>. The Jacobians are exact.</para>
/// </remarks>
public sealed class PolynomialVectorField : IOdeSystem
{
    private readonly int[] termEquation;
    private readonly int[][] termFactors;
    private readonly int[] offsetEquation;

    /// <summary>Creates the field.</summary>
    /// <param name="stateNames">The state names; their count is the state count.</param>
    /// <param name="terms">The terms; each names a valid equation and valid factor states.</param>
    /// <param name="hasOffset">For each equation, whether it carries a fitted offset b_j.</param>
    /// <exception cref="ArgumentOutOfRangeException">A term refers to a state that does not exist, or the offset flags have the wrong length.</exception>
    public PolynomialVectorField(IReadOnlyList<string> stateNames, IReadOnlyList<PolynomialTerm> terms, IReadOnlyList<bool> hasOffset)
    {
        var n = stateNames.Count;
        Preconditions.CheckArgumentRange(nameof(stateNames), n > 0, "needs at least one state");
        Preconditions.CheckArgumentRange(nameof(hasOffset), hasOffset.Count == n, "needs one flag per equation");
        foreach (var term in terms)
        {
            Preconditions.CheckArgumentRange(nameof(terms), term.Equation >= 0 && term.Equation < n && term.Factors.All(f => f >= 0 && f < n), $"term {term.Label} refers to a state that does not exist");
        }

        StateNames = stateNames.ToArray();
        Terms = terms.ToArray();
        HasOffset = hasOffset.ToArray();
        termEquation = terms.Select(t => t.Equation).ToArray();
        termFactors = terms.Select(t => t.Factors.ToArray()).ToArray();
        offsetEquation = Enumerable.Range(0, n).Where(j => hasOffset[j]).ToArray();
        ParameterNames = terms.Select(t => $"{stateNames[t.Equation]}':{t.Label}").Concat(offsetEquation.Select(j => $"{stateNames[j]}':offset")).ToArray();
    }

    /// <summary>The terms, in parameter order.</summary>
    public IReadOnlyList<PolynomialTerm> Terms { get; }

    /// <summary>Which equations carry a fitted offset.</summary>
    public IReadOnlyList<bool> HasOffset { get; }

    /// <summary>The number of term coefficients (the offsets follow them in the parameter vector).</summary>
    public int TermCount => termEquation.Length;

    /// <summary>The equations that carry an offset, in parameter order after the terms.</summary>
    public IReadOnlyList<int> OffsetEquations => offsetEquation;

    /// <inheritdoc />
    public int StateCount => StateNames.Count;

    /// <inheritdoc />
    public int ParameterCount => termEquation.Length + offsetEquation.Length;

    /// <inheritdoc />
    public IReadOnlyList<string> StateNames { get; }

    /// <inheritdoc />
    public IReadOnlyList<string> ParameterNames { get; }

    /// <summary>φ_t(V): the basis value of term <paramref name="term"/> at <paramref name="state"/>.</summary>
    public double Basis(int term, ReadOnlySpan<double> state)
    {
        var value = 1.0;
        foreach (var factor in termFactors[term])
        {
            value *= state[factor];
        }

        return value;
    }

    /// <inheritdoc />
    public void Evaluate(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> derivative)
    {
        derivative.Clear();
        for (var t = 0; t < termEquation.Length; t++)
        {
            derivative[termEquation[t]] += parameters[t] * Basis(t, state);
        }

        for (var k = 0; k < offsetEquation.Length; k++)
        {
            derivative[offsetEquation[k]] += parameters[termEquation.Length + k];
        }
    }

    /// <inheritdoc />
    public void EvaluateStateJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        var n = StateCount;
        jacobian.Clear();
        for (var t = 0; t < termEquation.Length; t++)
        {
            var factors = termFactors[t];
            for (var a = 0; a < factors.Length; a++)
            {
                // Product rule: d/dV_f of Π V over the factors drops one occurrence of V_f.
                var partial = parameters[t];
                for (var b = 0; b < factors.Length; b++)
                {
                    if (b != a)
                    {
                        partial *= state[factors[b]];
                    }
                }

                jacobian[termEquation[t] * n + factors[a]] += partial;
            }
        }
    }

    /// <inheritdoc />
    public void EvaluateParameterJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        var m = ParameterCount;
        jacobian.Clear();
        for (var t = 0; t < termEquation.Length; t++)
        {
            jacobian[termEquation[t] * m + t] = Basis(t, state);
        }

        for (var k = 0; k < offsetEquation.Length; k++)
        {
            jacobian[offsetEquation[k] * m + termEquation.Length + k] = 1;
        }
    }
}

using Patchproof.Core.Models.Expressions;

namespace Patchproof.Core.Models;

/// <summary>What one factor of a term's basis is.</summary>
public enum BasisFactorKind
{
    /// <summary>A state variable, raised to an integer power.</summary>
    State,

    /// <summary>A recorded input, raised to an integer power.</summary>
    Input,

    /// <summary>The time t, raised to an integer power.</summary>
    Time,

    /// <summary>Any other parameter-free function of states, time and inputs, such as <c>g(x)</c> or <c>cos(omega*t)</c>.</summary>
    Function,
}

/// <summary>One factor of a basis: a state, input, time or function, raised to a non-zero integer power.</summary>
/// <param name="Kind">What the factor is.</param>
/// <param name="Expression">The factor without its power, for example <c>x</c> or <c>g(x)</c>.</param>
/// <param name="Power">The integer power (negative for a divisor).</param>
public sealed record BasisFactor(BasisFactorKind Kind, Expression Expression, int Power)
{
    /// <summary>The state's index for a <see cref="BasisFactorKind.State"/> factor, else -1.</summary>
    public int StateIndex => Expression is StateExpression state ? state.Index : -1;
}

/// <summary>The parameter-free part of a term: a product of factors, with a canonical display text.</summary>
/// <remarks>
/// The text lists state factors in state order, then inputs, then t, then other functions by their
/// text; powers are written <c>x^3</c>, divisors after a slash (<c>x/y</c>), and the empty product is
/// <c>1</c> (a constant term). Two bases are the same exactly when their texts are equal.
/// </remarks>
/// <param name="Factors">The factors in canonical order; empty for the constant basis.</param>
/// <param name="Text">The canonical text, for example <c>x*z</c>, <c>y^2</c>, <c>g(x)</c> or <c>1</c>.</param>
/// <param name="Expression">The basis as an expression, to evaluate it on data.</param>
public sealed record TermBasis(IReadOnlyList<BasisFactor> Factors, string Text, Expression Expression)
{
    /// <summary>True for the constant basis 1.</summary>
    public bool IsConstant => Factors.Count == 0;

    /// <summary>The total power of the state factors (1 for <c>x</c>, 2 for <c>x*z</c>), 0 when there are none.</summary>
    public int StateDegree => Factors.Where(factor => factor.Kind == BasisFactorKind.State).Sum(factor => factor.Power);

    /// <summary>The canonical text.</summary>
    public override string ToString() => Text;
}

/// <summary>One coefficient-times-basis term of an equation: theta * phi(t, x, u), with theta an expression in parameters and constants.</summary>
/// <remarks>For Lorenz, x' = sigma*(y - x) has the terms (sigma, y) and (-sigma, x).</remarks>
/// <param name="Coefficient">theta, an expression in parameters, constants and numbers only.</param>
/// <param name="NominalCoefficient">theta at the model's nominal parameters.</param>
/// <param name="Basis">phi, free of parameters.</param>
public sealed record ModelTerm(Expression Coefficient, double NominalCoefficient, TermBasis Basis)
{
    /// <summary>The coefficient's text, for example <c>-sigma</c> or <c>-2*zeta*omega0</c>.</summary>
    public string CoefficientText => Coefficient.ToString();

    /// <summary>theta at the given parameters.</summary>
    /// <param name="parameters">The parameter vector, in the model's parameter order.</param>
    public double CoefficientAt(ReadOnlySpan<double> parameters) => ExpressionEvaluator.Evaluate(Coefficient, 0, [], parameters);

    /// <summary>For example <c>(-sigma) * x</c>.</summary>
    public override string ToString() => $"({CoefficientText}) * {Basis.Text}";
}

/// <summary>The term structure of one equation: the sum of its terms, or the reason it has none.</summary>
/// <remarks>
/// When <see cref="IsLinearInCoefficients"/> is true, f_i = sum of Coefficient * Basis over
/// <see cref="Terms"/> exactly (up to rounding), each basis distinct, in order of first appearance.
/// Otherwise the equation mixes parameters into a nonlinear function of the state (such as
/// <c>sin(omega*x)</c>) and <see cref="Reason"/> says where.
/// </remarks>
/// <param name="StateIndex">The index of the equation's state.</param>
/// <param name="StateName">The equation's state.</param>
/// <param name="IsLinearInCoefficients">True when the terms represent the right-hand side.</param>
/// <param name="Terms">The terms; empty when the equation is not linear in its coefficients.</param>
/// <param name="Reason">Why the equation is not linear in its coefficients, or null.</param>
public sealed record EquationTerms(int StateIndex, string StateName, bool IsLinearInCoefficients, IReadOnlyList<ModelTerm> Terms, string? Reason);

using System.Globalization;
using System.Text;
using Patchproof.Core.Models.Expressions;

namespace Patchproof.Core.Models;

/// <summary>Splits right-hand sides into coefficient-times-basis terms, where they are linear in their coefficients.</summary>
/// <remarks>
/// <para>The right-hand side is expanded into a sum of products (distributing products over sums, and
/// integer powers of sums), each product split into a scalar, factors that read only parameters and
/// constants (the coefficient) and factors that read no parameter (the basis). Products with the same
/// canonical basis are merged by adding their coefficients. A piecewise-linear function with fixed
/// slopes is one basis factor; with parameter slopes it splits into its segments, one term each.</para>
/// <para>The expansion fails, and the equation is reported as not linear in its coefficients, where a
/// function, power or divisor mixes states (or time, or inputs) with parameters.</para>
/// </remarks>
internal static class TermDecomposer
{
    public static IReadOnlyList<EquationTerms> Decompose(EquationModel model)
    {
        var nominal = model.NominalParameters();
        return [.. model.Equations.Select(equation => DecomposeEquation(equation, nominal))];
    }

    private static EquationTerms DecomposeEquation(ModelEquation equation, double[] nominal)
    {
        var products = Expand(equation.RightHandSide, out var reason);
        if (products is null)
        {
            return new EquationTerms(equation.StateIndex, equation.StateName, false, [], reason);
        }

        var groups = new List<(TermBasis Basis, List<Product> Products)>();
        foreach (var product in products)
        {
            var basis = BasisOf(product);
            var group = groups.FindIndex(g => g.Basis.Text == basis.Text);
            if (group < 0)
            {
                groups.Add((basis, [product]));
            }
            else
            {
                groups[group].Products.Add(product);
            }
        }

        var terms = new List<ModelTerm>();
        foreach (var (basis, members) in groups)
        {
            Expression? sum = null;
            foreach (var member in members)
            {
                var coefficient = CoefficientOf(member);
                sum = sum is null ? coefficient : new BinaryExpression(BinaryOperator.Add, sum, coefficient);
            }

            var simplified = ExpressionSimplifier.Simplify(sum!);
            if (simplified is NumberExpression { Value: 0.0 })
            {
                continue;
            }

            terms.Add(new ModelTerm(simplified, ExpressionEvaluator.Evaluate(simplified, 0, [], nominal), basis));
        }

        return new EquationTerms(equation.StateIndex, equation.StateName, true, terms, null);
    }

    /// <summary>scalar * product(coefficient factors) * product(basis factors ^ power).</summary>
    private sealed record Product(double Scalar, List<Expression> CoefficientFactors, List<Expression> CoefficientDivisors, List<(Expression Factor, int Power)> BasisFactors)
    {
        public static Product OfScalar(double scalar) => new(scalar, [], [], []);

        public Product Times(Product other)
        {
            var basis = new List<(Expression Factor, int Power)>(BasisFactors);
            foreach (var (factor, power) in other.BasisFactors)
            {
                var at = basis.FindIndex(entry => entry.Factor.Equals(factor));
                if (at < 0)
                {
                    basis.Add((factor, power));
                }
                else
                {
                    basis[at] = (factor, basis[at].Power + power);
                }
            }

            basis.RemoveAll(entry => entry.Power == 0);
            return new Product(Scalar * other.Scalar, [.. CoefficientFactors, .. other.CoefficientFactors], [.. CoefficientDivisors, .. other.CoefficientDivisors], basis);
        }

        public Product Negated() => this with { Scalar = -Scalar };
    }

    private static bool ReadsParameter(Expression expression) =>
        expression.Any(static node => node is ParameterExpression || (node is PiecewiseLinearExpression call && !call.Function.IsFixed));

    /// <summary>Sums, products, quotients, negations and small integer powers of compound bases are expanded; anything else is a basis factor as it stands.</summary>
    private static bool IsExpandable(Expression expression) => expression switch
    {
        NegateExpression => true,
        BinaryExpression { Operator: not BinaryOperator.Power } => true,
        BinaryExpression { Operator: BinaryOperator.Power, Left: not (StateExpression or InputExpression or TimeExpression), Right: NumberExpression exponent } =>
            exponent.Value is >= 1 and <= 6 && exponent.Value == Math.Floor(exponent.Value),
        _ => false,
    };

    private static bool ReadsVariable(Expression expression) => expression.DependsOnState || expression.DependsOnTimeOrInput;

    private static List<Product>? Expand(Expression expression, out string? reason)
    {
        reason = null;
        if (!ReadsVariable(expression))
        {
            return expression is NumberExpression number
                ? [Product.OfScalar(number.Value)]
                : expression is NegateExpression negate && !ReadsVariable(negate.Operand)
                    ? Expand(negate.Operand, out reason)?.Select(p => p.Negated()).ToList()
                    : [new Product(1.0, [expression], [], [])];
        }

        if (!ReadsParameter(expression) && !IsExpandable(expression))
        {
            return [BasisProduct(expression)];
        }

        switch (expression)
        {
            case NegateExpression negate:
                return Expand(negate.Operand, out reason)?.Select(p => p.Negated()).ToList();
            case BinaryExpression { Operator: BinaryOperator.Add or BinaryOperator.Subtract } sum:
                {
                    var left = Expand(sum.Left, out reason);
                    if (left is null)
                    {
                        return null;
                    }

                    var right = Expand(sum.Right, out reason);
                    if (right is null)
                    {
                        return null;
                    }

                    return [.. left, .. sum.Operator == BinaryOperator.Add ? right : right.Select(p => p.Negated())];
                }

            case BinaryExpression { Operator: BinaryOperator.Multiply } product:
                {
                    var left = Expand(product.Left, out reason);
                    if (left is null)
                    {
                        return null;
                    }

                    var right = Expand(product.Right, out reason);
                    if (right is null)
                    {
                        return null;
                    }

                    return [.. left.SelectMany(a => right.Select(a.Times))];
                }

            case BinaryExpression { Operator: BinaryOperator.Divide } quotient:
                {
                    var numerator = Expand(quotient.Left, out reason);
                    if (numerator is null)
                    {
                        return null;
                    }

                    if (!ReadsVariable(quotient.Right))
                    {
                        return [.. numerator.Select(p => p with { CoefficientDivisors = [.. p.CoefficientDivisors, quotient.Right] })];
                    }

                    if (!ReadsParameter(quotient.Right))
                    {
                        var divisor = new Product(1.0, [], [], [(quotient.Right, -1)]);
                        return [.. numerator.Select(p => p.Times(divisor))];
                    }

                    reason = $"the divisor {quotient.Right} mixes states with parameters";
                    return null;
                }

            case BinaryExpression { Operator: BinaryOperator.Power } power
                when power.Right is NumberExpression { Value: >= 1 and <= 6 } exponent && exponent.Value == Math.Floor(exponent.Value):
                {
                    var basis = Expand(power.Left, out reason);
                    if (basis is null)
                    {
                        return null;
                    }

                    var result = basis;
                    for (var k = 1; k < (int)exponent.Value; k++)
                    {
                        result = [.. result.SelectMany(a => basis.Select(a.Times))];
                    }

                    return result;
                }

            case PiecewiseLinearExpression piecewise when !ReadsParameter(piecewise.Argument):
                return Expand(piecewise.Function.Expand(piecewise.Argument), out reason);
            default:
                reason = $"{expression} mixes states, time or inputs with parameters";
                return null;
        }
    }

    /// <summary>A parameter-free expression as a basis product: integer powers of states, inputs and t stay factors; anything else is one opaque factor.</summary>
    private static Product BasisProduct(Expression expression)
    {
        switch (expression)
        {
            case StateExpression or InputExpression or TimeExpression:
                return new Product(1.0, [], [], [(expression, 1)]);
            case BinaryExpression { Operator: BinaryOperator.Power, Left: StateExpression or InputExpression or TimeExpression, Right: NumberExpression exponent } power
                when exponent.Value == Math.Floor(exponent.Value) && Math.Abs(exponent.Value) <= 64 && exponent.Value != 0:
                return new Product(1.0, [], [], [(power.Left, (int)exponent.Value)]);
            default:
                return new Product(1.0, [], [], [(expression, 1)]);
        }
    }

    private static int KindOrder(Expression factor) => factor switch
    {
        StateExpression state => state.Index,
        InputExpression input => 100_000 + input.Index,
        TimeExpression => 200_000,
        _ => 300_000,
    };

    private static TermBasis BasisOf(Product product)
    {
        var ordered = product.BasisFactors
            .OrderBy(entry => KindOrder(entry.Factor))
            .ThenBy(entry => entry.Factor.ToString(), StringComparer.Ordinal)
            .ToList();
        var factors = ordered.Select(entry => new BasisFactor(
            entry.Factor switch
            {
                StateExpression => BasisFactorKind.State,
                InputExpression => BasisFactorKind.Input,
                TimeExpression => BasisFactorKind.Time,
                _ => BasisFactorKind.Function,
            },
            entry.Factor,
            entry.Power)).ToList();

        Expression? numerator = null;
        Expression? denominator = null;
        foreach (var factor in factors)
        {
            var magnitude = Math.Abs(factor.Power);
            Expression powered = magnitude == 1 ? factor.Expression : new BinaryExpression(BinaryOperator.Power, factor.Expression, new NumberExpression(magnitude));
            if (factor.Power > 0)
            {
                numerator = numerator is null ? powered : new BinaryExpression(BinaryOperator.Multiply, numerator, powered);
            }
            else
            {
                denominator = denominator is null ? powered : new BinaryExpression(BinaryOperator.Multiply, denominator, powered);
            }
        }

        Expression expression = numerator ?? new NumberExpression(1.0);
        if (denominator is not null)
        {
            expression = new BinaryExpression(BinaryOperator.Divide, expression, denominator);
        }

        var text = factors.Count == 0 ? "1" : expression.ToString();
        return new TermBasis(factors, text, expression);
    }

    private static Expression CoefficientOf(Product product)
    {
        Expression coefficient = new NumberExpression(product.Scalar);
        foreach (var factor in product.CoefficientFactors)
        {
            coefficient = new BinaryExpression(BinaryOperator.Multiply, coefficient, factor);
        }

        foreach (var divisor in product.CoefficientDivisors)
        {
            coefficient = new BinaryExpression(BinaryOperator.Divide, coefficient, divisor);
        }

        return ExpressionSimplifier.Simplify(coefficient);
    }
}

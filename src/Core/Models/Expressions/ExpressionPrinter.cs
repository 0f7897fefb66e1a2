using System.Globalization;
using System.Text;

namespace Patchproof.Core.Models.Expressions;

/// <summary>Prints expression trees in the equation language with the fewest parentheses that keep the tree.</summary>
internal static class ExpressionPrinter
{
    private const int AdditivePrecedence = 1;
    private const int MultiplicativePrecedence = 2;
    private const int UnaryPrecedence = 3;
    private const int PowerPrecedence = 4;
    private const int AtomPrecedence = 5;

    public static string Print(Expression expression)
    {
        var builder = new StringBuilder();
        Write(builder, expression);
        return builder.ToString();
    }

    public static string FormatNumber(double value) => value.ToString("R", CultureInfo.InvariantCulture);

    private static int PrecedenceOf(Expression expression) => expression switch
    {
        BinaryExpression { Operator: BinaryOperator.Add or BinaryOperator.Subtract } => AdditivePrecedence,
        BinaryExpression { Operator: BinaryOperator.Multiply or BinaryOperator.Divide } => MultiplicativePrecedence,
        BinaryExpression { Operator: BinaryOperator.Power } => PowerPrecedence,
        NegateExpression => UnaryPrecedence,
        NumberExpression number when number.Value < 0 || double.IsNegative(number.Value) => UnaryPrecedence,
        _ => AtomPrecedence,
    };

    private static void WriteChild(StringBuilder builder, Expression child, bool parenthesize)
    {
        if (parenthesize)
        {
            builder.Append('(');
            Write(builder, child);
            builder.Append(')');
        }
        else
        {
            Write(builder, child);
        }
    }

    private static void Write(StringBuilder builder, Expression expression)
    {
        switch (expression)
        {
            case NumberExpression number:
                builder.Append(FormatNumber(number.Value));
                break;
            case StateExpression state:
                builder.Append(state.Name);
                break;
            case ParameterExpression parameter:
                builder.Append(parameter.Name);
                break;
            case ConstantExpression constant:
                builder.Append(constant.Name);
                break;
            case TimeExpression:
                builder.Append('t');
                break;
            case InputExpression input:
                builder.Append(input.Name);
                break;
            case NegateExpression negate:
                // -(a*b) prints as -a*b: negation is exact, so both readings give the same number.
                builder.Append('-');
                WriteChild(builder, negate.Operand, PrecedenceOf(negate.Operand) < MultiplicativePrecedence);
                break;
            case BinaryExpression binary:
                WriteBinary(builder, binary);
                break;
            case CallExpression call:
                builder.Append(FunctionNames.NameOf(call.Function)).Append('(');
                Write(builder, call.Argument);
                if (call.SecondArgument is not null)
                {
                    builder.Append(", ");
                    Write(builder, call.SecondArgument);
                }

                builder.Append(')');
                break;
            case PiecewiseLinearExpression piecewise:
                builder.Append(piecewise.Function.Name).Append('(');
                Write(builder, piecewise.Argument);
                builder.Append(')');
                break;
            case SegmentExpression segment:
                builder.Append(segment.FunctionName).Append('[').Append(segment.SegmentIndex.ToString(CultureInfo.InvariantCulture)).Append("](");
                Write(builder, segment.Argument);
                builder.Append(')');
                break;
            case WindowExpression window:
                builder.Append("window(").Append(FormatNumber(window.Lower)).Append(", ").Append(FormatNumber(window.Upper)).Append(", ");
                Write(builder, window.Argument);
                builder.Append(')');
                break;
            case ChooseExpression choose:
                builder.Append("choose(");
                Write(builder, choose.Left);
                builder.Append(", ");
                Write(builder, choose.Right);
                builder.Append(", ");
                Write(builder, choose.WhenLessOrEqual);
                builder.Append(", ");
                Write(builder, choose.Otherwise);
                builder.Append(')');
                break;
            default:
                throw new InvalidOperationException("Unknown expression node " + expression.GetType().Name);
        }
    }

    private static void WriteBinary(StringBuilder builder, BinaryExpression binary)
    {
        var precedence = PrecedenceOf(binary);
        var (symbol, spaced) = binary.Operator switch
        {
            BinaryOperator.Add => ("+", true),
            BinaryOperator.Subtract => ("-", true),
            BinaryOperator.Multiply => ("*", false),
            BinaryOperator.Divide => ("/", false),
            _ => ("^", false),
        };

        if (binary.Operator == BinaryOperator.Power)
        {
            // Right-associative, and the exponent may carry a unary minus (x^-2).
            WriteChild(builder, binary.Left, PrecedenceOf(binary.Left) <= PowerPrecedence);
            builder.Append(symbol);
            WriteChild(builder, binary.Right, PrecedenceOf(binary.Right) < UnaryPrecedence);
            return;
        }

        WriteChild(builder, binary.Left, PrecedenceOf(binary.Left) < precedence);
        builder.Append(spaced ? " " + symbol + " " : symbol);
        WriteChild(builder, binary.Right, PrecedenceOf(binary.Right) <= precedence);
    }
}

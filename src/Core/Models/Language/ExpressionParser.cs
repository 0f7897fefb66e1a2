using Patchproof.Core.Models.Expressions;

namespace Patchproof.Core.Models.Language;

/// <summary>Raised inside the parser to abandon one line; never leaves <see cref="ModelParser"/>.</summary>
internal sealed class LineSyntaxException(Token at, string message) : Exception(message)
{
    public Token At { get; } = at;
}

/// <summary>What a name may denote where an expression is being read.</summary>
internal enum NameContext
{
    /// <summary>Numbers, named constants and functions only: constant values, nominal values, breakpoints, initial values.</summary>
    ConstantOnly,

    /// <summary>Also parameters: slopes of piecewise-linear functions.</summary>
    ParametersAllowed,

    /// <summary>Everything: right-hand sides.</summary>
    Equation,
}

/// <summary>Recursive-descent reader of one expression from a line of tokens.</summary>
/// <remarks>
/// Grammar, loosest first: sum := product (('+' | '-') product)*; product := unary (('*' | '/') unary)*;
/// unary := ('-' | '+') unary | power; power := primary ('^' unary)?; primary := number | name |
/// name '(' arguments ')' | '(' sum ')'. So -x^2 is -(x^2), 2^-1 is 0.5 and a^b^c is a^(b^c).
/// </remarks>
internal sealed class ExpressionParser(IReadOnlyList<Token> tokens, int start, ModelSymbols symbols, NameContext context)
{
    private int position = start;

    public int Position => position;

    private Token Current => tokens[position];

    public Token Peek() => Current;

    public Token Advance() => tokens[position++];

    public bool Accept(TokenKind kind)
    {
        if (Current.Kind == kind)
        {
            position++;
            return true;
        }

        return false;
    }

    public Token Expect(TokenKind kind, string what)
    {
        if (Current.Kind != kind)
        {
            throw new LineSyntaxException(Current, $"expected {what}, found {Current.Describe()}");
        }

        return Advance();
    }

    public Expression ParseExpression()
    {
        var left = ParseProduct();
        while (Current.Kind is TokenKind.Plus or TokenKind.Minus)
        {
            var op = Advance().Kind == TokenKind.Plus ? BinaryOperator.Add : BinaryOperator.Subtract;
            left = new BinaryExpression(op, left, ParseOperand(ParseProduct));
        }

        return left;
    }

    private Expression ParseOperand(Func<Expression> next)
    {
        var previous = tokens[position - 1];
        if (Current.Kind is TokenKind.EndOfLine or TokenKind.RightParenthesis or TokenKind.Comma or TokenKind.Star or TokenKind.Slash or TokenKind.Caret or TokenKind.Equals)
        {
            throw new LineSyntaxException(Current, $"expected an expression after '{previous.Text}', found {Current.Describe()}");
        }

        return next();
    }

    private Expression ParseProduct()
    {
        var left = ParseUnary();
        while (Current.Kind is TokenKind.Star or TokenKind.Slash)
        {
            var op = Advance().Kind == TokenKind.Star ? BinaryOperator.Multiply : BinaryOperator.Divide;
            left = new BinaryExpression(op, left, ParseOperand(ParseUnary));
        }

        return left;
    }

    private Expression ParseUnary()
    {
        if (Accept(TokenKind.Minus))
        {
            var operand = ParseOperand(ParseUnary);
            return operand is NumberExpression number ? new NumberExpression(-number.Value) : new NegateExpression(operand);
        }

        if (Accept(TokenKind.Plus))
        {
            return ParseOperand(ParseUnary);
        }

        return ParsePower();
    }

    private Expression ParsePower()
    {
        var basis = ParsePrimary();
        if (Accept(TokenKind.Caret))
        {
            return new BinaryExpression(BinaryOperator.Power, basis, ParseOperand(ParseUnary));
        }

        return basis;
    }

    private Expression ParsePrimary()
    {
        var token = Current;
        switch (token.Kind)
        {
            case TokenKind.Number:
                Advance();
                return new NumberExpression(token.Number);
            case TokenKind.LeftParenthesis:
                Advance();
                var inner = ParseOperand(ParseExpression);
                if (Current.Kind != TokenKind.RightParenthesis)
                {
                    throw new LineSyntaxException(Current, $"expected ')' to close the '(' at column {token.Column}, found {Current.Describe()}");
                }

                Advance();
                return inner;
            case TokenKind.Identifier:
                Advance();
                return Current.Kind == TokenKind.LeftParenthesis ? ParseCall(token) : ResolveName(token);
            case TokenKind.Prime:
                throw new LineSyntaxException(token, "a derivative (') may only stand on the left of '='");
            default:
                throw new LineSyntaxException(token, $"expected a number, a name or '(', found {token.Describe()}");
        }
    }

    private Expression ParseCall(Token name)
    {
        var open = Advance();
        var arguments = new List<Expression>();
        if (Current.Kind != TokenKind.RightParenthesis)
        {
            arguments.Add(ParseOperand(ParseExpression));
            while (Accept(TokenKind.Comma))
            {
                arguments.Add(ParseOperand(ParseExpression));
            }
        }

        if (Current.Kind != TokenKind.RightParenthesis)
        {
            throw new LineSyntaxException(Current, $"expected ',' or ')' to close the '(' at column {open.Column}, found {Current.Describe()}");
        }

        Advance();
        if (FunctionNames.TryFind(name.Text, out var function))
        {
            var expected = FunctionNames.ArgumentCountOf(function);
            if (arguments.Count != expected)
            {
                throw new LineSyntaxException(name, $"{name.Text} takes {Plural(expected, "argument")}, found {arguments.Count}");
            }

            return new CallExpression(function, arguments[0], expected == 2 ? arguments[1] : null);
        }

        if (symbols.TryGet(name.Text, out var symbol) && symbol.Kind == SymbolKind.Piecewise)
        {
            if (context != NameContext.Equation)
            {
                throw new LineSyntaxException(name, $"the piecewise-linear function '{name.Text}' may only be used in equations");
            }

            if (arguments.Count != 1)
            {
                throw new LineSyntaxException(name, $"{name.Text} takes 1 argument, found {arguments.Count}");
            }

            return new PiecewiseLinearExpression(symbol.Piecewise!, arguments[0]);
        }

        if (symbols.TryGet(name.Text, out var other))
        {
            throw new LineSyntaxException(name, $"'{name.Text}' is {other.Describe()}, not a function");
        }

        throw new LineSyntaxException(name, $"unknown function '{name.Text}': the functions are {string.Join(", ", FunctionNames.All)}, or a pwl declared in the model");
    }

    private Expression ResolveName(Token name)
    {
        if (name.Text == "t")
        {
            return context == NameContext.Equation
                ? new TimeExpression()
                : throw new LineSyntaxException(name, "the time t may only be used in equations");
        }

        if (FunctionNames.TryFind(name.Text, out _))
        {
            throw new LineSyntaxException(name, $"'{name.Text}' is a function: write {name.Text}(...)");
        }

        if (name.Text == "pi")
        {
            return new ConstantExpression("pi", Math.PI);
        }

        if (!symbols.TryGet(name.Text, out var symbol))
        {
            throw new LineSyntaxException(name, $"unknown name '{name.Text}': declare it as a parameter ({name.Text} = value), a constant (const {name.Text} = value), a state or an input");
        }

        switch (symbol.Kind)
        {
            case SymbolKind.Constant when symbol.Value is double value:
                return new ConstantExpression(name.Text, value);
            case SymbolKind.Constant:
                throw new LineSyntaxException(name, $"the constant '{name.Text}' is used before its definition on line {symbol.Line}");
            case SymbolKind.Parameter when context != NameContext.ConstantOnly:
                return new ParameterExpression(name.Text, symbol.Index);
            case SymbolKind.State when context == NameContext.Equation:
                return new StateExpression(name.Text, symbol.Index);
            case SymbolKind.Input when context == NameContext.Equation:
                return new InputExpression(name.Text, symbol.Index);
            case SymbolKind.Piecewise:
                throw new LineSyntaxException(name, $"'{name.Text}' is a piecewise-linear function: write {name.Text}(...)");
            default:
                throw new LineSyntaxException(name, context == NameContext.ConstantOnly
                    ? $"a value here must be a number or use only constants, and '{name.Text}' is {symbol.Describe()}"
                    : $"a slope may use numbers, constants and parameters, and '{name.Text}' is {symbol.Describe()}");
        }
    }

    private static string Plural(int count, string noun) => count == 1 ? $"1 {noun}" : $"{count} {noun}s";
}

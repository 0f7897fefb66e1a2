using Patchproof.Core.Models.Expressions;
using Patchproof.Core.Models.Language;

namespace Patchproof.Core.Models;

/// <summary>Reads a model written in the equation language (see docs/models.md) into an <see cref="EquationModel"/>.</summary>
/// <remarks>
/// <para>One statement per line; <c>#</c> starts a comment. Statements, in any order:
/// <c>state x = 1, y, z</c> (states with optional default initial values), <c>sigma = 10</c> or
/// <c>param sigma = 10</c> (a fitted parameter and its nominal value), <c>const g = 9.81</c> (a fixed
/// named constant), <c>input u</c> (a recorded channel), <c>pwl f breaks(-1, 1) slopes(m1, m0, m1)</c>
/// (a piecewise-linear function through the origin), and one equation per state, <c>x' = ...</c> or
/// <c>dx/dt = ...</c>.</para>
/// <para>Every problem is reported, not only the first: syntax errors (with what was expected), unknown
/// names, duplicate definitions, states without an equation, equations for unknown states, parameters
/// without a nominal value and wrong argument counts, each at its line and column. An unused
/// parameter is a warning.</para>
/// </remarks>
public static class ModelParser
{
    private static readonly HashSet<string> Keywords = new(StringComparer.Ordinal) { "state", "param", "const", "input", "pwl", "t", "pi" };

    /// <summary>Parses model text.</summary>
    /// <param name="text">The model in the equation language.</param>
    /// <param name="fileName">The file name for diagnostics, or null for text from no file.</param>
    /// <returns>The model, or the errors (file, line, column, message) that prevent one.</returns>
    public static ParseResult<EquationModel> Parse(string text, string? fileName = null) => new Session(text, fileName).Run();

    private enum LineKind
    {
        State,
        Parameter,
        Constant,
        Input,
        Piecewise,
        Equation,
    }

    private sealed record Statement(LineKind Kind, List<Token> Tokens, int Start);

    private sealed class Session(string text, string? fileName)
    {
        private readonly List<SourceDiagnostic> errors = [];
        private readonly List<SourceDiagnostic> warnings = [];
        private readonly ModelSymbols symbols = new();
        private readonly List<Statement> statements = [];
        private readonly HashSet<string> statesWithEquationLines = new(StringComparer.Ordinal);

        public ParseResult<EquationModel> Run()
        {
            var lines = ModelLexer.Tokenize(text);
            foreach (var line in lines)
            {
                Guard(line[0], () => Declare(line));
            }

            var constants = new List<ModelConstant>();
            foreach (var statement in statements.Where(s => s.Kind == LineKind.Constant))
            {
                if (!Guard(statement.Tokens[0], () => constants.Add(ReadConstant(statement))) && symbols.TryGet(statement.Tokens[1].Text, out var failed))
                {
                    // Its error is reported once; later uses read NaN instead of failing again.
                    failed.Value = double.NaN;
                }
            }

            var parameters = new List<ModelParameter>();
            foreach (var statement in statements.Where(s => s.Kind == LineKind.Parameter))
            {
                Guard(statement.Tokens[0], () => parameters.Add(ReadParameter(statement)));
            }

            var piecewise = new List<PiecewiseLinearFunction>();
            foreach (var statement in statements.Where(s => s.Kind == LineKind.Piecewise))
            {
                Guard(statement.Tokens[0], () => piecewise.Add(ReadPiecewise(statement)));
            }

            var initialValues = new Dictionary<string, double>(StringComparer.Ordinal);
            foreach (var statement in statements.Where(s => s.Kind == LineKind.State))
            {
                Guard(statement.Tokens[0], () => ReadStateValues(statement, initialValues));
            }

            var equations = new Dictionary<int, ModelEquation>();
            foreach (var statement in statements.Where(s => s.Kind == LineKind.Equation))
            {
                Guard(statement.Tokens[0], () => ReadEquation(statement, equations));
            }

            var states = symbols.OfKind(SymbolKind.State).ToList();
            if (states.Count == 0 && errors.Count == 0)
            {
                errors.Add(SourceDiagnostic.ErrorAt(fileName, 0, 0, "the model declares no state: start with a line such as 'state x, y'"));
            }

            // A state whose equation line failed already has an error there; do not report it twice.
            foreach (var state in states.Where(state => !equations.ContainsKey(state.Index) && !statesWithEquationLines.Contains(state.Name)))
            {
                errors.Add(SourceDiagnostic.ErrorAt(fileName, state.Line, state.Column, $"the state '{state.Name}' has no equation: add {state.Name}' = ..."));
            }

            if (errors.Count > 0)
            {
                return ParseResult<EquationModel>.ForErrors([.. errors.OrderBy(e => e.Line).ThenBy(e => e.Column)], warnings);
            }

            WarnAboutUnusedParameters(equations.Values, piecewise);
            var model = new EquationModel(
                [.. states.Select(state => new ModelState(state.Name, initialValues.GetValueOrDefault(state.Name), state.Line))],
                parameters,
                constants,
                [.. symbols.OfKind(SymbolKind.Input).Select(input => input.Name)],
                piecewise,
                [.. equations.OrderBy(pair => pair.Key).Select(pair => pair.Value)]);
            return ParseResult<EquationModel>.ForValue(model, warnings);
        }

        private bool Guard(Token lineStart, Action action)
        {
            try
            {
                action();
                return true;
            }
            catch (LineSyntaxException error)
            {
                errors.Add(SourceDiagnostic.ErrorAt(fileName, error.At.Line, error.At.Column, error.Message));
                return false;
            }
        }

        private void WarnAboutUnusedParameters(IEnumerable<ModelEquation> equations, IEnumerable<PiecewiseLinearFunction> piecewise)
        {
            var used = new HashSet<string>(StringComparer.Ordinal);
            void Collect(Expression expression)
            {
                if (expression is ParameterExpression parameter)
                {
                    used.Add(parameter.Name);
                }

                if (expression is PiecewiseLinearExpression call)
                {
                    foreach (var slope in call.Function.Slopes)
                    {
                        Collect(slope);
                    }
                }

                foreach (var child in expression.Children)
                {
                    Collect(child);
                }
            }

            foreach (var equation in equations)
            {
                Collect(equation.RightHandSide);
            }

            foreach (var parameter in symbols.OfKind(SymbolKind.Parameter).Where(p => !used.Contains(p.Name)))
            {
                warnings.Add(SourceDiagnostic.WarningAt(fileName, parameter.Line, parameter.Column, $"the parameter '{parameter.Name}' is never used"));
            }
        }

        private void DeclareName(Token name, SymbolKind kind)
        {
            if (name.Kind != TokenKind.Identifier)
            {
                throw new LineSyntaxException(name, $"expected a name, found {name.Describe()}");
            }

            if (Keywords.Contains(name.Text) || FunctionNames.TryFind(name.Text, out _))
            {
                throw new LineSyntaxException(name, name.Text switch
                {
                    "t" => "'t' is the time variable and cannot be declared",
                    "pi" => "'pi' is the built-in constant 3.14159... and cannot be declared",
                    _ => $"'{name.Text}' is a reserved word and cannot be declared",
                });
            }

            if (symbols.TryGet(name.Text, out var existing))
            {
                throw new LineSyntaxException(name, $"'{name.Text}' is already defined on line {existing.Line} as {existing.Describe()}");
            }

            symbols.Add(name.Text, kind, name.Line, name.Column);
        }

        private void Declare(List<Token> line)
        {
            var first = line[0];
            var second = line[1];
            if (first.Kind == TokenKind.Identifier)
            {
                switch (first.Text)
                {
                    case "state":
                        DeclareList(line, SymbolKind.State, allowValues: true);
                        statements.Add(new Statement(LineKind.State, line, 1));
                        return;
                    case "input":
                        DeclareList(line, SymbolKind.Input, allowValues: false);
                        return;
                    case "const":
                        DeclareName(second, SymbolKind.Constant);
                        statements.Add(new Statement(LineKind.Constant, line, 1));
                        return;
                    case "param":
                        DeclareName(second, SymbolKind.Parameter);
                        statements.Add(new Statement(LineKind.Parameter, line, 1));
                        return;
                    case "pwl":
                        DeclareName(second, SymbolKind.Piecewise);
                        statements.Add(new Statement(LineKind.Piecewise, line, 1));
                        return;
                }

                if (second.Kind == TokenKind.Prime)
                {
                    statesWithEquationLines.Add(first.Text);
                    statements.Add(new Statement(LineKind.Equation, line, 0));
                    return;
                }

                if (second.Kind == TokenKind.Slash && first.Text.Length > 1 && first.Text[0] == 'd')
                {
                    statesWithEquationLines.Add(first.Text[1..]);
                    statements.Add(new Statement(LineKind.Equation, line, 0));
                    return;
                }

                if (second.Kind == TokenKind.Equals)
                {
                    DeclareName(first, SymbolKind.Parameter);
                    statements.Add(new Statement(LineKind.Parameter, line, 0));
                    return;
                }

                throw new LineSyntaxException(second, $"expected '=' (a parameter), ' (an equation such as {first.Text}' = ...) or a keyword (state, param, const, input, pwl), found {second.Describe()}");
            }

            throw new LineSyntaxException(first, $"expected a declaration (state, param, const, input, pwl), a parameter (name = value) or an equation (x' = ... or dx/dt = ...), found {first.Describe()}");
        }

        private void DeclareList(List<Token> line, SymbolKind kind, bool allowValues)
        {
            var i = 1;
            while (true)
            {
                DeclareName(line[i], kind);
                i++;
                if (line[i].Kind == TokenKind.Equals && allowValues)
                {
                    // Skip the initial value; it is read once constants are known.
                    var depth = 0;
                    i++;
                    while (line[i].Kind != TokenKind.EndOfLine && !(depth == 0 && line[i].Kind == TokenKind.Comma))
                    {
                        depth += line[i].Kind == TokenKind.LeftParenthesis ? 1 : line[i].Kind == TokenKind.RightParenthesis ? -1 : 0;
                        i++;
                    }
                }

                if (line[i].Kind == TokenKind.EndOfLine)
                {
                    return;
                }

                if (line[i].Kind != TokenKind.Comma)
                {
                    throw new LineSyntaxException(line[i], allowValues
                        ? $"expected ',', '=' or the end of the line after a state name, found {line[i].Describe()}"
                        : $"expected ',' or the end of the line after an input name, found {line[i].Describe()}");
                }

                i++;
            }
        }

        private static void ExpectEnd(ExpressionParser parser)
        {
            var next = parser.Peek();
            if (next.Kind != TokenKind.EndOfLine)
            {
                throw new LineSyntaxException(next, next.Kind is TokenKind.Identifier or TokenKind.Number or TokenKind.LeftParenthesis
                    ? $"expected an operator or the end of the line, found {next.Describe()}"
                    : next.Kind switch
                    {
                        TokenKind.RightParenthesis => "found ')' without a matching '('",
                        TokenKind.Prime => "a derivative (') may only stand on the left of '='",
                        TokenKind.Invalid => $"unexpected character {next.Describe()}",
                        _ => $"expected an operator or the end of the line, found {next.Describe()}",
                    });
            }
        }

        private double ReadConstantValue(ExpressionParser parser)
        {
            var expression = parser.ParseExpression();
            var value = ExpressionEvaluator.Evaluate(expression, 0, [], []);
            return value;
        }

        private ModelConstant ReadConstant(Statement statement)
        {
            var name = statement.Tokens[1];
            var parser = new ExpressionParser(statement.Tokens, 2, symbols, NameContext.ConstantOnly);
            parser.Expect(TokenKind.Equals, $"'=' and the value of the constant '{name.Text}'");
            var valueStart = parser.Peek();
            var value = ReadConstantValue(parser);
            ExpectEnd(parser);
            CheckFinite(valueStart, value, name.Text);
            symbols.TryGet(name.Text, out var symbol);
            symbol.Value = value;
            return new ModelConstant(name.Text, value, name.Line);
        }

        private ModelParameter ReadParameter(Statement statement)
        {
            var name = statement.Tokens[statement.Start];
            var parser = new ExpressionParser(statement.Tokens, statement.Start + 1, symbols, NameContext.ConstantOnly);
            if (parser.Peek().Kind == TokenKind.EndOfLine)
            {
                throw new LineSyntaxException(name, $"the parameter '{name.Text}' has no nominal value: write {name.Text} = value");
            }

            parser.Expect(TokenKind.Equals, $"'=' and the nominal value of '{name.Text}'");
            var valueStart = parser.Peek();
            var value = ReadConstantValue(parser);
            ExpectEnd(parser);
            CheckFinite(valueStart, value, name.Text);
            return new ModelParameter(name.Text, value, name.Line);
        }

        private static void CheckFinite(Token at, double value, string name)
        {
            if (!double.IsFinite(value))
            {
                throw new LineSyntaxException(at, $"the value of '{name}' is not a finite number");
            }
        }

        private PiecewiseLinearFunction ReadPiecewise(Statement statement)
        {
            var name = statement.Tokens[1];
            var constants = new ExpressionParser(statement.Tokens, 2, symbols, NameContext.ConstantOnly);
            ExpectKeyword(constants, "breaks", $"'breaks(...)' after the name of the piecewise-linear function '{name.Text}'");
            constants.Expect(TokenKind.LeftParenthesis, "'(' after 'breaks'");
            var breakpoints = new List<double>();
            do
            {
                var at = constants.Peek();
                var value = ReadConstantValue(constants);
                CheckFinite(at, value, "a breakpoint");
                if (breakpoints.Count > 0 && value <= breakpoints[^1])
                {
                    throw new LineSyntaxException(at, "breakpoints must be strictly increasing");
                }

                breakpoints.Add(value);
            }
            while (constants.Accept(TokenKind.Comma));
            constants.Expect(TokenKind.RightParenthesis, "',' or ')' after a breakpoint");

            var slopesParser = new ExpressionParser(statement.Tokens, constants.Position, symbols, NameContext.ParametersAllowed);
            var slopesKeyword = slopesParser.Peek();
            ExpectKeyword(slopesParser, "slopes", "'slopes(...)' after the breakpoints");
            slopesParser.Expect(TokenKind.LeftParenthesis, "'(' after 'slopes'");
            var slopes = new List<Expression>();
            do
            {
                slopes.Add(slopesParser.ParseExpression());
            }
            while (slopesParser.Accept(TokenKind.Comma));
            slopesParser.Expect(TokenKind.RightParenthesis, "',' or ')' after a slope");
            ExpectEnd(slopesParser);
            if (slopes.Count != breakpoints.Count + 1)
            {
                throw new LineSyntaxException(slopesKeyword, $"{breakpoints.Count} breakpoint(s) need {breakpoints.Count + 1} slopes, found {slopes.Count}");
            }

            var function = new PiecewiseLinearFunction(name.Text, breakpoints, slopes);
            symbols.TryGet(name.Text, out var symbol);
            symbol.Piecewise = function;
            return function;
        }

        private static void ExpectKeyword(ExpressionParser parser, string keyword, string what)
        {
            var token = parser.Peek();
            if (token.Kind != TokenKind.Identifier || token.Text != keyword)
            {
                throw new LineSyntaxException(token, $"expected {what}, found {token.Describe()}");
            }

            parser.Advance();
        }

        private void ReadStateValues(Statement statement, Dictionary<string, double> initialValues)
        {
            var parser = new ExpressionParser(statement.Tokens, 1, symbols, NameContext.ConstantOnly);
            while (true)
            {
                var name = parser.Advance();
                if (parser.Accept(TokenKind.Equals))
                {
                    var at = parser.Peek();
                    var value = ReadConstantValue(parser);
                    CheckFinite(at, value, $"the initial value of {name.Text}");
                    initialValues[name.Text] = value;
                }

                if (!parser.Accept(TokenKind.Comma))
                {
                    ExpectEnd(parser);
                    return;
                }
            }
        }

        private void ReadEquation(Statement statement, Dictionary<int, ModelEquation> equations)
        {
            var tokens = statement.Tokens;
            var head = tokens[0];
            string stateName;
            int next;
            if (tokens[1].Kind == TokenKind.Prime)
            {
                stateName = head.Text;
                next = 2;
            }
            else
            {
                stateName = head.Text[1..];
                if (tokens[2].Kind != TokenKind.Identifier || tokens[2].Text != "dt")
                {
                    throw new LineSyntaxException(tokens[2], $"expected 'dt' in d{stateName}/dt, found {tokens[2].Describe()}");
                }

                next = 3;
            }

            var parser = new ExpressionParser(tokens, next, symbols, NameContext.Equation);
            parser.Expect(TokenKind.Equals, $"'=' after the derivative of {stateName}");
            if (!symbols.TryGet(stateName, out var state) || state.Kind != SymbolKind.State)
            {
                throw new LineSyntaxException(head, state is null
                    ? $"an equation for '{stateName}', which is not a state: declare it with 'state {stateName}'"
                    : $"an equation for '{stateName}', which is {state.Describe()}, not a state");
            }

            var rightHandSide = parser.ParseExpression();
            ExpectEnd(parser);
            if (equations.TryGetValue(state.Index, out var first))
            {
                throw new LineSyntaxException(head, $"a second equation for '{stateName}' (the first is on line {first.Line})");
            }

            equations[state.Index] = new ModelEquation(state.Index, stateName, rightHandSide, head.Line);
        }
    }
}

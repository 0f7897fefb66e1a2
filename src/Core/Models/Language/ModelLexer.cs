using System.Globalization;

namespace Patchproof.Core.Models.Language;

/// <summary>Splits model text into lines of tokens; <c>#</c> starts a comment that runs to the end of the line.</summary>
internal static class ModelLexer
{
    /// <summary>The non-empty lines of the text, each ending with an end-of-line token.</summary>
    public static List<List<Token>> Tokenize(string text)
    {
        var lines = new List<List<Token>>();
        var rawLines = text.Replace("\r\n", "\n", StringComparison.Ordinal).Split('\n');
        for (var lineIndex = 0; lineIndex < rawLines.Length; lineIndex++)
        {
            var tokens = TokenizeLine(rawLines[lineIndex], lineIndex + 1);
            if (tokens.Count > 1)
            {
                lines.Add(tokens);
            }
        }

        return lines;
    }

    private static bool IsIdentifierStart(char c) => char.IsLetter(c) || c == '_';

    private static bool IsIdentifierPart(char c) => char.IsLetterOrDigit(c) || c == '_';

    private static List<Token> TokenizeLine(string line, int lineNumber)
    {
        var tokens = new List<Token>();
        var i = 0;
        while (i < line.Length)
        {
            var c = line[i];
            var column = i + 1;
            if (c == '#')
            {
                break;
            }

            if (char.IsWhiteSpace(c))
            {
                i++;
                continue;
            }

            if (IsIdentifierStart(c))
            {
                var start = i;
                while (i < line.Length && IsIdentifierPart(line[i]))
                {
                    i++;
                }

                tokens.Add(new Token(TokenKind.Identifier, line[start..i], 0, lineNumber, column));
                continue;
            }

            if (char.IsAsciiDigit(c) || (c == '.' && i + 1 < line.Length && char.IsAsciiDigit(line[i + 1])))
            {
                var start = i;
                while (i < line.Length && char.IsAsciiDigit(line[i]))
                {
                    i++;
                }

                if (i < line.Length && line[i] == '.')
                {
                    i++;
                    while (i < line.Length && char.IsAsciiDigit(line[i]))
                    {
                        i++;
                    }
                }

                if (i < line.Length && (line[i] == 'e' || line[i] == 'E'))
                {
                    var exponentStart = i;
                    i++;
                    if (i < line.Length && (line[i] == '+' || line[i] == '-'))
                    {
                        i++;
                    }

                    if (i < line.Length && char.IsAsciiDigit(line[i]))
                    {
                        while (i < line.Length && char.IsAsciiDigit(line[i]))
                        {
                            i++;
                        }
                    }
                    else
                    {
                        i = exponentStart;
                    }
                }

                var text = line[start..i];
                tokens.Add(new Token(TokenKind.Number, text, double.Parse(text, NumberStyles.Float, CultureInfo.InvariantCulture), lineNumber, column));
                continue;
            }

            var kind = c switch
            {
                '+' => TokenKind.Plus,
                '-' => TokenKind.Minus,
                '*' => TokenKind.Star,
                '/' => TokenKind.Slash,
                '^' => TokenKind.Caret,
                '(' => TokenKind.LeftParenthesis,
                ')' => TokenKind.RightParenthesis,
                ',' => TokenKind.Comma,
                '=' => TokenKind.Equals,
                '\'' => TokenKind.Prime,
                _ => TokenKind.Invalid,
            };
            tokens.Add(new Token(kind, c.ToString(), 0, lineNumber, column));
            i++;
        }

        tokens.Add(new Token(TokenKind.EndOfLine, string.Empty, 0, lineNumber, line.Length + 1));
        return tokens;
    }
}

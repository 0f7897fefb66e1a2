namespace Patchproof.Core.Models.Language;

/// <summary>The kinds of token in the equation language.</summary>
internal enum TokenKind
{
    Identifier,
    Number,
    Plus,
    Minus,
    Star,
    Slash,
    Caret,
    LeftParenthesis,
    RightParenthesis,
    Comma,
    Equals,
    Prime,
    EndOfLine,
    Invalid,
}

/// <summary>One token with its place in the text (1-based line and column).</summary>
internal readonly record struct Token(TokenKind Kind, string Text, double Number, int Line, int Column)
{
    public string Describe() => Kind switch
    {
        TokenKind.EndOfLine => "the end of the line",
        TokenKind.Identifier => $"'{Text}'",
        TokenKind.Number => $"the number {Text}",
        _ => $"'{Text}'",
    };
}

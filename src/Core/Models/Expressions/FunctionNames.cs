using System.Collections.Frozen;

namespace Patchproof.Core.Models.Expressions;

/// <summary>The names of the built-in functions as written in equations, and how many arguments each takes.</summary>
public static class FunctionNames
{
    private static readonly FrozenDictionary<string, MathFunction> ByName = new Dictionary<string, MathFunction>(StringComparer.Ordinal)
    {
        ["abs"] = MathFunction.Abs,
        ["sign"] = MathFunction.Sign,
        ["min"] = MathFunction.Min,
        ["max"] = MathFunction.Max,
        ["exp"] = MathFunction.Exp,
        ["log"] = MathFunction.Log,
        ["sqrt"] = MathFunction.Sqrt,
        ["sin"] = MathFunction.Sin,
        ["cos"] = MathFunction.Cos,
        ["tanh"] = MathFunction.Tanh,
    }.ToFrozenDictionary(StringComparer.Ordinal);

    /// <summary>Every built-in function name, for example <c>abs</c> and <c>tanh</c>.</summary>
    public static IReadOnlyCollection<string> All => ByName.Keys;

    /// <summary>The function a name denotes, if it is a built-in function.</summary>
    /// <param name="name">The name as written.</param>
    /// <param name="function">The function, when found.</param>
    /// <returns>True for a built-in function name.</returns>
    public static bool TryFind(string name, out MathFunction function) => ByName.TryGetValue(name, out function);

    /// <summary>The name a function is written with.</summary>
    /// <param name="function">The function.</param>
    public static string NameOf(MathFunction function) => function switch
    {
        MathFunction.Abs => "abs",
        MathFunction.Sign => "sign",
        MathFunction.Min => "min",
        MathFunction.Max => "max",
        MathFunction.Exp => "exp",
        MathFunction.Log => "log",
        MathFunction.Sqrt => "sqrt",
        MathFunction.Sin => "sin",
        MathFunction.Cos => "cos",
        _ => "tanh",
    };

    /// <summary>How many arguments the function takes: 2 for min and max, 1 otherwise.</summary>
    /// <param name="function">The function.</param>
    public static int ArgumentCountOf(MathFunction function) => function is MathFunction.Min or MathFunction.Max ? 2 : 1;
}

namespace Patchproof.Core.Models.Expressions;

/// <summary>The scalar functions behind expression nodes that <see cref="Math"/> lacks, shared by the interpreter and compiled code.</summary>
/// <remarks>Public so that compiled right-hand sides can call them; each is pure and allocation-free.</remarks>
public static class ModelMath
{
    /// <summary>sign(a) as a double: -1, 0 or 1, and NaN for NaN (<see cref="Math.Sign(double)"/> throws on NaN).</summary>
    /// <param name="value">a.</param>
    public static double Sign(double value) => value > 0 ? 1.0 : value < 0 ? -1.0 : value == 0 ? 0.0 : double.NaN;

    /// <summary>clamp(a, lower, upper) - clamp(0, lower, upper): the signed length of [0, a] inside [lower, upper].</summary>
    /// <param name="lower">The segment's left end (may be negative infinity).</param>
    /// <param name="upper">The segment's right end (may be positive infinity).</param>
    /// <param name="value">a.</param>
    public static double Segment(double lower, double upper, double value) =>
        Math.Min(Math.Max(value, lower), upper) - Math.Min(Math.Max(0.0, lower), upper);

    /// <summary>1 when lower &lt;= a &lt; upper, else 0 (NaN for NaN): at a breakpoint the segment on the right counts.</summary>
    /// <param name="lower">The left end.</param>
    /// <param name="upper">The right end.</param>
    /// <param name="value">a.</param>
    public static double Window(double lower, double upper, double value) =>
        double.IsNaN(value) ? double.NaN : value >= lower && value < upper ? 1.0 : 0.0;

    /// <summary><paramref name="whenLessOrEqual"/> when a &lt;= b, else <paramref name="otherwise"/>.</summary>
    /// <param name="left">a.</param>
    /// <param name="right">b.</param>
    /// <param name="whenLessOrEqual">The value when a &lt;= b.</param>
    /// <param name="otherwise">The value otherwise.</param>
    public static double Choose(double left, double right, double whenLessOrEqual, double otherwise) =>
        left <= right ? whenLessOrEqual : otherwise;

    /// <summary>min(a, b) with NaN propagating.</summary>
    /// <param name="left">a.</param>
    /// <param name="right">b.</param>
    public static double Min(double left, double right) => Math.Min(left, right);

    /// <summary>max(a, b) with NaN propagating.</summary>
    /// <param name="left">a.</param>
    /// <param name="right">b.</param>
    public static double Max(double left, double right) => Math.Max(left, right);

    /// <summary>The built-in function applied to its arguments.</summary>
    /// <param name="function">The function.</param>
    /// <param name="argument">The first argument.</param>
    /// <param name="second">The second argument of min and max; ignored otherwise.</param>
    public static double Apply(MathFunction function, double argument, double second) => function switch
    {
        MathFunction.Abs => Math.Abs(argument),
        MathFunction.Sign => Sign(argument),
        MathFunction.Min => Math.Min(argument, second),
        MathFunction.Max => Math.Max(argument, second),
        MathFunction.Exp => Math.Exp(argument),
        MathFunction.Log => Math.Log(argument),
        MathFunction.Sqrt => Math.Sqrt(argument),
        MathFunction.Sin => Math.Sin(argument),
        MathFunction.Cos => Math.Cos(argument),
        _ => Math.Tanh(argument),
    };

    /// <summary>a ^ b, with small integer exponents by multiplication (exact and fast).</summary>
    /// <param name="value">a.</param>
    /// <param name="exponent">b.</param>
    public static double Power(double value, double exponent) => exponent switch
    {
        2.0 => value * value,
        3.0 => value * value * value,
        1.0 => value,
        _ => Math.Pow(value, exponent),
    };
}

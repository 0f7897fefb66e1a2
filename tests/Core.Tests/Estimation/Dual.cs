namespace Patchproof.Core.Tests.Estimation;

/// <summary>A forward-mode dual number a + b epsilon (epsilon^2 = 0): evaluating a model on it yields the value and one exact partial derivative.</summary>
internal readonly record struct Dual(double Value, double Derivative)
{
    public static implicit operator Dual(double value) => new(value, 0);

    public static Dual operator +(Dual a, Dual b) => new(a.Value + b.Value, a.Derivative + b.Derivative);

    public static Dual operator -(Dual a, Dual b) => new(a.Value - b.Value, a.Derivative - b.Derivative);

    public static Dual operator -(Dual a) => new(-a.Value, -a.Derivative);

    public static Dual operator *(Dual a, Dual b) => new(a.Value * b.Value, a.Derivative * b.Value + a.Value * b.Derivative);

    public static Dual operator /(Dual a, Dual b) => new(a.Value / b.Value, (a.Derivative * b.Value - a.Value * b.Derivative) / (b.Value * b.Value));

    public static Dual Exp(Dual a)
    {
        var e = Math.Exp(a.Value);
        return new(e, e * a.Derivative);
    }

    public static Dual Log(Dual a) => new(Math.Log(a.Value), a.Derivative / a.Value);

    public static Dual Sin(Dual a) => new(Math.Sin(a.Value), Math.Cos(a.Value) * a.Derivative);

    public static Dual Cos(Dual a) => new(Math.Cos(a.Value), -Math.Sin(a.Value) * a.Derivative);

    public static Dual Atan(Dual a) => new(Math.Atan(a.Value), a.Derivative / (1 + a.Value * a.Value));

    /// <summary>a^b for a &gt; 0, through exp(b ln a).</summary>
    public static Dual Pow(Dual a, Dual b)
    {
        var value = Math.Pow(a.Value, b.Value);
        var throughExponent = b.Derivative == 0 ? 0 : value * b.Derivative * Math.Log(a.Value);
        return new(value, throughExponent + b.Value * Math.Pow(a.Value, b.Value - 1) * a.Derivative);
    }

    public static Dual Sqr(Dual a) => a * a;
}

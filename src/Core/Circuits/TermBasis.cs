using System.Collections.Immutable;

namespace Patchproof.Core.Circuits;

/// <summary>The basis signal phi of one term: 1, a variable, a product of variables, or a function block's output.</summary>
/// <remarks>
/// <para><see cref="Variables"/> lists the variables multiplied together, sorted by name, a variable
/// appearing once per power (<c>x, z</c> for x*z; <c>x, x</c> for x squared). Empty means the
/// constant 1. When <see cref="Function"/> is set the basis is that piecewise-linear block's output
/// g(V) and <see cref="Variables"/> holds its single input variable.</para>
/// <para>The same type serves machine units (variables are integrator voltages) and problem units
/// (variables are model variables); the names are the same. Equality is by <see cref="Key"/>.</para>
/// </remarks>
public sealed class TermBasis : IEquatable<TermBasis>
{
    private TermBasis(ImmutableArray<string> variables, string? function)
    {
        Variables = variables;
        Function = function;
        Key = function is not null
            ? $"{function}({variables[0]})"
            : variables.IsEmpty ? "1" : string.Join("*", variables);
    }

    /// <summary>The constant basis 1.</summary>
    public static TermBasis One { get; } = new([], null);

    /// <summary>The variables multiplied together, sorted; empty for the constant.</summary>
    public ImmutableArray<string> Variables { get; }

    /// <summary>The function block's output name when the basis is g(V), else null.</summary>
    public string? Function { get; }

    /// <summary>The canonical text: <c>1</c>, <c>x</c>, <c>x*z</c>, <c>g(x)</c>.</summary>
    public string Key { get; }

    /// <summary>The polynomial degree: 0 for a constant, 1 for a variable, 2 for a product of two; 1 for a function basis.</summary>
    public int Degree => Variables.Length;

    /// <summary>True for the constant basis.</summary>
    public bool IsConstant => Variables.IsEmpty && Function is null;

    /// <summary>A product of variables (one name per power, any order).</summary>
    /// <param name="variables">The variable names; none gives the constant.</param>
    /// <returns>The basis.</returns>
    public static TermBasis Product(params IEnumerable<string> variables) =>
        new([.. variables.Order(StringComparer.Ordinal)], null);

    /// <summary>The output of a function block reading one variable.</summary>
    /// <param name="function">The function block's output name.</param>
    /// <param name="input">The variable it reads.</param>
    /// <returns>The basis.</returns>
    public static TermBasis OfFunction(string function, string input) => new([input], function);

    /// <summary>Parses <c>1</c>, <c>x</c>, <c>x*z</c>, <c>x^2</c>.</summary>
    /// <param name="text">The text.</param>
    /// <returns>The basis.</returns>
    public static TermBasis Parse(string text)
    {
        var trimmed = text.Trim();
        if (trimmed.Length == 0 || trimmed == "1")
        {
            return One;
        }

        var names = new List<string>();
        foreach (var factor in trimmed.Split('*', StringSplitOptions.TrimEntries | StringSplitOptions.RemoveEmptyEntries))
        {
            var caret = factor.IndexOf('^', StringComparison.Ordinal);
            if (caret > 0 && int.TryParse(factor[(caret + 1)..], out var power))
            {
                names.AddRange(Enumerable.Repeat(factor[..caret], power));
            }
            else
            {
                names.Add(factor);
            }
        }

        return Product(names);
    }

    /// <summary>The product of two bases (neither a function basis).</summary>
    /// <param name="other">The other factor.</param>
    /// <returns>The product.</returns>
    public TermBasis Times(TermBasis other)
    {
        ArgumentNullException.ThrowIfNull(other);
        return Product(Variables.Concat(other.Variables));
    }

    /// <summary>Evaluates the basis at given variable values.</summary>
    /// <param name="valueOf">The value of each variable by name (volts or problem units).</param>
    /// <param name="function">Evaluates a function basis; unused for products.</param>
    /// <returns>phi.</returns>
    public double Evaluate(Func<string, double> valueOf, Func<string, double, double>? function = null)
    {
        ArgumentNullException.ThrowIfNull(valueOf);
        if (Function is not null)
        {
            return function is null ? double.NaN : function(Function, valueOf(Variables[0]));
        }

        var product = 1.0;
        foreach (var name in Variables)
        {
            product *= valueOf(name);
        }

        return product;
    }

    /// <inheritdoc/>
    public bool Equals(TermBasis? other) => other is not null && other.Key == Key;

    /// <inheritdoc/>
    public override bool Equals(object? obj) => Equals(obj as TermBasis);

    /// <inheritdoc/>
    public override int GetHashCode() => StringComparer.Ordinal.GetHashCode(Key);

    /// <inheritdoc/>
    public override string ToString() => Key;
}

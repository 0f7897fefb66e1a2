namespace Patchproof.Core.Estimation;

/// <summary>One basis term of an equation-error regression: a product of state variables (a monomial), for example x*z.</summary>
/// <remarks>
/// <para><see cref="Factors"/> lists state indices, repeated for powers: [] is the constant 1, [0] is x, [0, 2] is
/// x*z, [1, 1] is y^2. The term's value at a sample is the product of the listed (mapped, scaled) channels. This is the
/// shape the equation-error stage needs from a model's terms; a model's term structure maps onto it one to one.</para>
/// </remarks>
/// <param name="Name">A label for reports, for example <c>x*z</c>.</param>
/// <param name="Factors">State indices whose product the term is; empty for the constant.</param>
public sealed record RegressionTerm(string Name, IReadOnlyList<int> Factors)
{
    /// <summary>The term's value at sample <paramref name="sample"/> of the given states.</summary>
    /// <param name="states">One array per state variable.</param>
    /// <param name="sample">The sample index.</param>
    /// <returns>The product of the factors there (1 for the constant).</returns>
    public double Evaluate(IReadOnlyList<double[]> states, int sample)
    {
        ArgumentNullException.ThrowIfNull(states);
        var product = 1.0;
        foreach (var factor in Factors)
        {
            product *= states[factor][sample];
        }

        return product;
    }
}

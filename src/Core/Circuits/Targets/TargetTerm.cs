namespace Patchproof.Core.Circuits.Targets;

/// <summary>One term of a target equation in problem units: dx_j/dT contains Factor * p * phi(x), or Factor * phi(x) without a parameter.</summary>
/// <param name="Variable">The equation's variable x_j.</param>
/// <param name="Basis">phi, in problem variables.</param>
/// <param name="Factor">A fixed number, usually +1 or -1.</param>
/// <param name="Parameter">The parameter multiplying the term, or null.</param>
public sealed record TargetTerm(string Variable, TermBasis Basis, double Factor, string? Parameter = null)
{
    /// <summary>The coefficient for given parameter values.</summary>
    /// <param name="valueOf">The value of each parameter by name.</param>
    /// <returns>Factor * p (or Factor alone).</returns>
    public double Coefficient(Func<string, double> valueOf)
    {
        ArgumentNullException.ThrowIfNull(valueOf);
        return Parameter is null ? Factor : Factor * valueOf(Parameter);
    }
}

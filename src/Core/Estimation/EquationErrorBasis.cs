using Patchproof.Core.Models;

namespace Patchproof.Core.Estimation;

/// <summary>The regression terms and nominal coefficients of a model's equations, in the shape the equation-error stage and the mapping search take.</summary>
/// <remarks>Each model term whose basis is a product of state powers becomes a <see cref="RegressionTerm"/> (x^2*z as
/// factors [0, 0, 2]). A constant basis term is left out: the regression adds its own constant to every equation.</remarks>
/// <param name="Terms">For each equation, its non-constant terms.</param>
/// <param name="NominalCoefficients">For each equation, the nominal coefficient of each of those terms.</param>
public sealed record EquationErrorBasis(IReadOnlyList<IReadOnlyList<RegressionTerm>> Terms, IReadOnlyList<IReadOnlyList<double>> NominalCoefficients)
{
    /// <summary>Builds the basis from a model's term structure.</summary>
    /// <param name="equations">The model's equations (<see cref="EquationModel.Terms"/>).</param>
    /// <param name="basis">Receives the basis when every equation qualifies.</param>
    /// <param name="reason">Receives why not, naming the equation and term, when one does not.</param>
    /// <returns>True when every equation is linear in its coefficients and every basis is a product of states.</returns>
    public static bool TryFromModel(IReadOnlyList<EquationTerms> equations, out EquationErrorBasis? basis, out string? reason)
    {
        ArgumentNullException.ThrowIfNull(equations);
        var terms = new List<IReadOnlyList<RegressionTerm>>(equations.Count);
        var nominal = new List<IReadOnlyList<double>>(equations.Count);
        foreach (var equation in equations)
        {
            if (!equation.IsLinearInCoefficients)
            {
                (basis, reason) = (null, $"equation {equation.StateName}' is not linear in its coefficients: {equation.Reason}");
                return false;
            }

            var row = new List<RegressionTerm>();
            var values = new List<double>();
            foreach (var term in equation.Terms.Where(term => !term.Basis.IsConstant))
            {
                if (term.Basis.Factors.Any(factor => factor.Kind != BasisFactorKind.State || factor.Power < 1))
                {
                    (basis, reason) = (null, $"equation {equation.StateName}': term {term.Basis.Text} is not a product of states");
                    return false;
                }

                row.Add(new RegressionTerm(term.Basis.Text, term.Basis.Factors.SelectMany(factor => Enumerable.Repeat(factor.StateIndex, factor.Power)).ToArray()));
                values.Add(term.NominalCoefficient);
            }

            terms.Add(row);
            nominal.Add(values);
        }

        (basis, reason) = (new EquationErrorBasis(terms, nominal), null);
        return true;
    }
}

using System.Collections.Immutable;

namespace Patchproof.Core.Circuits.Targets;

/// <summary>A polynomial system in problem units, written as coefficient-times-basis terms: what a board is meant to compute.</summary>
/// <remarks>
/// <para>dx_j/dT = sum over the terms of equation j of c_t * phi_t(x), with c_t = Factor * p (see
/// <see cref="TargetTerm"/>). Problem time T is dimensionless; the board's time scale maps it to seconds.</para>
/// <para><see cref="TypicalRanges"/> gives max |x_j| seen on the attractor (or the transient) from the
/// default initial state, used when no range is given and none is simulated.</para>
/// </remarks>
/// <param name="Name">The model's name, for example <c>lorenz</c>.</param>
/// <param name="Variables">The variable names in order.</param>
/// <param name="Parameters">The parameter names with their default values, in order.</param>
/// <param name="Terms">Every term of every equation.</param>
/// <param name="DefaultInitialState">A starting state in problem units (one per variable).</param>
/// <param name="TypicalRanges">max |x_j| per variable, in problem units.</param>
public sealed record TargetSystem(
    string Name,
    ImmutableArray<string> Variables,
    ImmutableArray<KeyValuePair<string, double>> Parameters,
    ImmutableArray<TargetTerm> Terms,
    ImmutableArray<double> DefaultInitialState,
    ImmutableArray<double> TypicalRanges)
{
    /// <summary>The default value of a parameter, or an override from <paramref name="overrides"/>.</summary>
    /// <param name="name">The parameter's name.</param>
    /// <param name="overrides">Values that replace the defaults, or null.</param>
    /// <returns>The value.</returns>
    /// <exception cref="ArgumentException">The parameter is unknown.</exception>
    public double ParameterValue(string name, IReadOnlyDictionary<string, double>? overrides = null)
    {
        if (overrides is not null && overrides.TryGetValue(name, out var value))
        {
            return value;
        }

        foreach (var pair in Parameters)
        {
            if (pair.Key == name)
            {
                return pair.Value;
            }
        }

        throw new ArgumentException($"model '{Name}' has no parameter '{name}'", nameof(name));
    }

    /// <summary>The terms of one equation.</summary>
    /// <param name="variable">The equation's variable.</param>
    /// <returns>Its terms.</returns>
    public IEnumerable<TargetTerm> TermsOf(string variable) => Terms.Where(term => term.Variable == variable);

    /// <summary>The model as an ODE system in problem units, its parameters in the order of <see cref="Parameters"/>.</summary>
    /// <returns>The system.</returns>
    public Models.IOdeSystem ToOdeSystem() => new TargetOdeSystem(this);

    /// <summary>The parameter values in order, with overrides applied.</summary>
    /// <param name="overrides">Values replacing defaults, or null.</param>
    /// <returns>The parameter vector.</returns>
    public ImmutableArray<double> ParameterVector(IReadOnlyDictionary<string, double>? overrides = null) =>
        [.. Parameters.Select(pair => ParameterValue(pair.Key, overrides))];
}

using System.Collections.Immutable;
using System.Globalization;
using Patchproof.Core.Models;
using Patchproof.Core.Models.Expressions;
using Patchproof.Core.Simulation.Synthesis;

namespace Patchproof.Core.Circuits.Targets;

/// <summary>Turns a model of the equation language into a board target, term by term, or says which terms the board cannot realize.</summary>
/// <remarks>
/// <para>Each coefficient-times-basis term of <see cref="EquationModel.Terms"/> becomes a
/// <see cref="TargetTerm"/>: a basis of at most two state factors (the builder's multipliers take two
/// inputs), and a coefficient that is a constant or one parameter times a constant (one resistor
/// sets one coefficient). Refused: an equation not linear in its coefficients, a basis of degree 3
/// or more, a divisor, a recorded input, the time t, a function of the state (sin, exp, tanh, a
/// piecewise-linear function: the builder places no function block) and a coefficient that reads
/// two parameters or is not proportional to its parameter.</para>
/// <para>The initial state is the model's; the typical ranges are max |x| over the model's own
/// trajectory from that state (<see cref="ModelRangeFinder"/>, no transient skipped).</para>
/// </remarks>
public static class ModelTargets
{
    /// <summary>Problem time simulated to find the ranges of a model that suggests none.</summary>
    public const double DefaultRangeDuration = 50;

    private static readonly Lazy<ImmutableArray<(BuiltInModel Model, ModelTargetResult Result)>> CatalogResults =
        new(() => [.. ModelCatalog.All.Select(model => (model, FromModel(model.Parse(), model.Name, model.SuggestedDuration)))]);

    /// <summary>Every catalog model with its target or its refusals, in catalog order.</summary>
    public static ImmutableArray<(BuiltInModel Model, ModelTargetResult Result)> Catalog => CatalogResults.Value;

    /// <summary>The target of a catalog model, or its refusals.</summary>
    /// <param name="name">The catalog name (case ignored).</param>
    /// <returns>The result, or null when the catalog has no such model.</returns>
    public static ModelTargetResult? FromCatalog(string? name)
    {
        foreach (var (model, result) in Catalog)
        {
            if (string.Equals(model.Name, name?.Trim(), StringComparison.OrdinalIgnoreCase))
            {
                return result;
            }
        }

        return null;
    }

    /// <summary>Builds the target of a model at its nominal parameters.</summary>
    /// <param name="model">The parsed model.</param>
    /// <param name="name">The name to record in designs, for example the catalog name or the file's name.</param>
    /// <param name="rangeDuration">Problem time to simulate from the initial state to find the typical ranges.</param>
    /// <returns>The target, or every refused equation and term.</returns>
    public static ModelTargetResult FromModel(EquationModel model, string name, double rangeDuration = DefaultRangeDuration)
    {
        ArgumentNullException.ThrowIfNull(model);
        ArgumentException.ThrowIfNullOrWhiteSpace(name);
        Preconditions.CheckArgumentRange(nameof(rangeDuration), rangeDuration > 0 && double.IsFinite(rangeDuration), "must be positive");
        var (terms, refusals) = Decompose(model);
        if (refusals.Count > 0)
        {
            return new ModelTargetResult(null, [.. refusals]);
        }

        var variables = model.StateNames.ToImmutableArray();
        var provisional = new TargetSystem(
            name,
            variables,
            [.. model.Parameters.Select(parameter => new KeyValuePair<string, double>(parameter.Name, parameter.NominalValue))],
            [.. terms],
            [.. model.DefaultInitialState()],
            [.. variables.Select(_ => 1.0)]);
        var ranges = ModelRangeFinder.FindRanges(provisional, null, settle: 0, span: rangeDuration);
        var unbounded = variables.Where(variable => !double.IsFinite(ranges[variable])).ToList();
        if (unbounded.Count > 0)
        {
            return new ModelTargetResult(null, [.. unbounded.Select(variable => new TargetRefusal(variable, model.Equations[variables.IndexOf(variable)].Line, string.Empty,
                $"{variable} does not stay finite over {rangeDuration.ToString("G4", CultureInfo.InvariantCulture)} time units from the initial state, so no amplitude scale fits it"))]);
        }

        return new ModelTargetResult(provisional with { TypicalRanges = [.. variables.Select(variable => ranges[variable])] }, []);
    }

    /// <summary>What the board cannot realize in a model, found from its terms alone (no simulation).</summary>
    /// <param name="model">The parsed model.</param>
    /// <returns>The refused equations and terms; empty when every term can be realized.</returns>
    public static ImmutableArray<TargetRefusal> RefusalsOf(EquationModel model)
    {
        ArgumentNullException.ThrowIfNull(model);
        return [.. Decompose(model).Refusals];
    }

    private static (List<TargetTerm> Terms, List<TargetRefusal> Refusals) Decompose(EquationModel model)
    {
        var nominal = model.NominalParameters();
        var refusals = new List<TargetRefusal>();
        var terms = new List<TargetTerm>();
        foreach (var equation in model.Terms())
        {
            var line = model.Equations[equation.StateIndex].Line;
            if (!equation.IsLinearInCoefficients)
            {
                refusals.Add(new(equation.StateName, line, string.Empty, $"the right-hand side is not a sum of coefficient-times-basis terms ({equation.Reason}); a resistor can only scale a signal"));
                continue;
            }

            foreach (var term in equation.Terms)
            {
                var basis = BasisOf(term.Basis, out var basisReason);
                var coefficient = CoefficientOf(term, nominal, model.ParameterNames, out var coefficientReason);
                var reason = basisReason ?? coefficientReason;
                if (reason is not null)
                {
                    refusals.Add(new(equation.StateName, line, term.ToString(), reason));
                    continue;
                }

                if (coefficient.Factor != 0)
                {
                    terms.Add(new TargetTerm(equation.StateName, basis!, coefficient.Factor, coefficient.Parameter));
                }
            }
        }

        return (terms, refusals);
    }

    private static TermBasis? BasisOf(Models.TermBasis basis, out string? reason)
    {
        reason = null;
        var names = new List<string>();
        foreach (var factor in basis.Factors)
        {
            switch (factor.Kind)
            {
                case BasisFactorKind.State when factor.Power < 0:
                    reason = $"it divides by {factor.Expression}; the board has no divider";
                    return null;
                case BasisFactorKind.State:
                    names.AddRange(Enumerable.Repeat(((StateExpression)factor.Expression).Name, factor.Power));
                    break;
                case BasisFactorKind.Input:
                    reason = $"it reads the recorded input {factor.Expression}; a design is built from the states alone";
                    return null;
                case BasisFactorKind.Time:
                    reason = "it reads the time t; the board has no time or signal generator";
                    return null;
                default:
                    reason = factor.Expression is PiecewiseLinearExpression or SegmentExpression
                        ? $"{factor.Expression} is a piecewise-linear function; the builder places no function block, so wire it by hand (docs/circuits.md)"
                        : $"{factor.Expression} is not a polynomial in the states; the board's blocks compute sums and products of two signals only";
                    return null;
            }
        }

        if (names.Count > 2)
        {
            reason = $"its basis {basis.Text} has {names.Count} state factors; the board's multipliers take two inputs";
            return null;
        }

        return TermBasis.Product(names);
    }

    /// <summary>The coefficient as Factor * p: a constant, or one parameter times a constant (checked by evaluating it at p = 0, 1, 2 and -3).</summary>
    private static (double Factor, string? Parameter) CoefficientOf(ModelTerm term, double[] nominal, IReadOnlyList<string> parameterNames, out string? reason)
    {
        reason = null;
        var read = parameterNames.Select((name, index) => (name, index)).Where(pair => term.Coefficient.Any(node => node is ParameterExpression p && p.Index == pair.index)).ToList();
        if (read.Count == 0)
        {
            return (term.NominalCoefficient, null);
        }

        if (read.Count > 1)
        {
            reason = $"its coefficient {term.CoefficientText} reads {string.Join(" and ", read.Select(pair => pair.name))}; one resistor sets one parameter, so write the product as one parameter";
            return (0, null);
        }

        var (parameter, at) = read[0];
        double Value(double p)
        {
            var vector = (double[])nominal.Clone();
            vector[at] = p;
            return term.CoefficientAt(vector);
        }

        var factor = Value(1);
        var tolerance = 1e-9 * Math.Max(Math.Abs(factor), 1e-300);
        if (!double.IsFinite(factor) || Math.Abs(Value(0)) > tolerance || Math.Abs(Value(2) - (2 * factor)) > 2 * tolerance || Math.Abs(Value(-3) + (3 * factor)) > 3 * tolerance)
        {
            reason = $"its coefficient {term.CoefficientText} is not proportional to {parameter}; the board's resistor sets a coefficient linear in one parameter";
            return (0, null);
        }

        return (factor, parameter);
    }
}

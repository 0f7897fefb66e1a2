using Patchproof.Core.Models.Expressions;

namespace Patchproof.Core.Models;

/// <summary>A state variable declared in a model, with its default initial value.</summary>
/// <param name="Name">The state's name.</param>
/// <param name="InitialValue">The default initial value given with <c>state x = 1</c>, or 0 when none was given.</param>
/// <param name="Line">The line of its declaration (1-based), or 0 for a model built in code.</param>
public sealed record ModelState(string Name, double InitialValue, int Line = 0);

/// <summary>A fitted parameter declared in a model, with its nominal value.</summary>
/// <param name="Name">The parameter's name.</param>
/// <param name="NominalValue">Its nominal value (the value used unless the caller supplies others).</param>
/// <param name="Line">The line of its declaration (1-based), or 0 for a model built in code.</param>
public sealed record ModelParameter(string Name, double NominalValue, int Line = 0);

/// <summary>A named constant: fixed, never fitted, inlined as a number when compiled.</summary>
/// <param name="Name">The constant's name.</param>
/// <param name="Value">Its value.</param>
/// <param name="Line">The line of its declaration (1-based), or 0 for a model built in code.</param>
public sealed record ModelConstant(string Name, double Value, int Line = 0);

/// <summary>One equation dx_i/dt = f_i(t, x, p, u).</summary>
/// <param name="StateIndex">The index of the state on the left.</param>
/// <param name="StateName">The name of the state on the left.</param>
/// <param name="RightHandSide">f_i as written (not simplified).</param>
/// <param name="Line">The equation's line (1-based), or 0 for a model built in code.</param>
public sealed record ModelEquation(int StateIndex, string StateName, Expression RightHandSide, int Line = 0);

/// <summary>A model read from the equation language: states, parameters, constants, inputs, piecewise-linear functions and one equation per state.</summary>
/// <remarks>
/// <para>Produced by <see cref="ModelParser.Parse"/>, which guarantees that every state has exactly one
/// equation (<see cref="Equations"/> is in state order), every name used is declared, and every
/// parameter has a nominal value.</para>
/// <para>Units are the model's own problem units and problem time. <see cref="Compile()"/> turns the
/// model into an allocation-free <see cref="IOdeSystem"/>; <see cref="Terms"/> gives its
/// coefficient-times-basis structure.</para>
/// </remarks>
/// <param name="States">The states in declaration order.</param>
/// <param name="Parameters">The fitted parameters in declaration order.</param>
/// <param name="Constants">The named constants.</param>
/// <param name="InputNames">The names of the recorded inputs, in declaration order.</param>
/// <param name="PiecewiseFunctions">The piecewise-linear functions declared.</param>
/// <param name="Equations">One equation per state, in state order.</param>
public sealed record EquationModel(
    IReadOnlyList<ModelState> States,
    IReadOnlyList<ModelParameter> Parameters,
    IReadOnlyList<ModelConstant> Constants,
    IReadOnlyList<string> InputNames,
    IReadOnlyList<PiecewiseLinearFunction> PiecewiseFunctions,
    IReadOnlyList<ModelEquation> Equations)
{
    /// <summary>The state names in order.</summary>
    public IReadOnlyList<string> StateNames => [.. States.Select(state => state.Name)];

    /// <summary>The parameter names in order.</summary>
    public IReadOnlyList<string> ParameterNames => [.. Parameters.Select(parameter => parameter.Name)];

    /// <summary>The nominal parameter vector, in parameter order.</summary>
    public double[] NominalParameters() => [.. Parameters.Select(parameter => parameter.NominalValue)];

    /// <summary>The default initial state, in state order (0 where the text gave none).</summary>
    public double[] DefaultInitialState() => [.. States.Select(state => state.InitialValue)];

    /// <summary>The index of a parameter by name, or -1.</summary>
    /// <param name="name">The parameter's name.</param>
    public int IndexOfParameter(string name)
    {
        for (var k = 0; k < Parameters.Count; k++)
        {
            if (Parameters[k].Name == name)
            {
                return k;
            }
        }

        return -1;
    }

    /// <summary>A copy with one parameter's nominal value replaced.</summary>
    /// <param name="name">The parameter's name.</param>
    /// <param name="nominalValue">The new nominal value (finite).</param>
    /// <exception cref="ArgumentOutOfRangeException">No parameter has that name, or the value is not finite.</exception>
    public EquationModel WithNominalValue(string name, double nominalValue)
    {
        var index = IndexOfParameter(name);
        Preconditions.CheckArgumentRange(nameof(name), index >= 0, $"the model has no parameter '{name}'");
        Preconditions.CheckFinite(nameof(nominalValue), nominalValue);
        var parameters = Parameters.ToArray();
        parameters[index] = parameters[index] with { NominalValue = nominalValue };
        return this with { Parameters = parameters };
    }

    /// <summary>Compiles the model into an allocation-free, thread-safe system with symbolic Jacobians.</summary>
    /// <exception cref="InvalidOperationException">The model reads recorded inputs; use <see cref="Compile(IReadOnlyList{SampledSignal})"/>.</exception>
    public CompiledModel Compile()
    {
        if (InputNames.Count > 0)
        {
            throw new InvalidOperationException($"The model reads the input(s) {string.Join(", ", InputNames)}; compile it with their signals.");
        }

        return ModelCompiler.Compile(this, []);
    }

    /// <summary>Compiles the model with its recorded inputs bound to sampled signals (linear interpolation between samples).</summary>
    /// <param name="inputs">One signal per input, in <see cref="InputNames"/> order.</param>
    /// <exception cref="ArgumentOutOfRangeException">The number of signals differs from the number of inputs.</exception>
    public CompiledModel Compile(IReadOnlyList<SampledSignal> inputs)
    {
        Preconditions.CheckArgumentRange(nameof(inputs), inputs.Count == InputNames.Count, $"the model has {InputNames.Count} input(s), {inputs.Count} signal(s) were given");
        return ModelCompiler.Compile(this, inputs);
    }

    /// <summary>The coefficient-times-basis structure of every equation (see <see cref="EquationTerms"/>).</summary>
    public IReadOnlyList<EquationTerms> Terms() => TermDecomposer.Decompose(this);
}

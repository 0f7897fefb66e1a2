using Patchproof.Core.Models;

namespace Patchproof.Core.Circuits.Targets;

/// <summary>A <see cref="TargetSystem"/> evaluated as an ODE system in problem units, without allocating.</summary>
/// <remarks>Terms are compiled once into index arrays; the parameter vector follows
/// <see cref="TargetSystem.Parameters"/>. Jacobians are exact (polynomial terms).</remarks>
internal sealed class TargetOdeSystem : IOdeSystem
{
    private readonly int[] equation;
    private readonly int[] parameter;
    private readonly double[] factor;
    private readonly int[][] powers;

    public TargetOdeSystem(TargetSystem target)
    {
        StateNames = target.Variables;
        ParameterNames = [.. target.Parameters.Select(pair => pair.Key)];
        var count = target.Terms.Length;
        equation = new int[count];
        parameter = new int[count];
        factor = new double[count];
        powers = new int[count][];
        for (var t = 0; t < count; t++)
        {
            var term = target.Terms[t];
            equation[t] = target.Variables.IndexOf(term.Variable);
            parameter[t] = term.Parameter is null ? -1 : ParameterNames.ToList().IndexOf(term.Parameter);
            factor[t] = term.Factor;
            powers[t] = [.. term.Basis.Variables.Select(name => target.Variables.IndexOf(name))];
        }
    }

    public int StateCount => StateNames.Count;

    public int ParameterCount => ParameterNames.Count;

    public IReadOnlyList<string> StateNames { get; }

    public IReadOnlyList<string> ParameterNames { get; }

    public void Evaluate(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> derivative)
    {
        derivative.Clear();
        for (var t = 0; t < factor.Length; t++)
        {
            var value = factor[t] * (parameter[t] >= 0 ? parameters[parameter[t]] : 1.0);
            foreach (var index in powers[t])
            {
                value *= state[index];
            }

            derivative[equation[t]] += value;
        }
    }

    public void EvaluateStateJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        var n = StateCount;
        jacobian.Clear();
        for (var t = 0; t < factor.Length; t++)
        {
            var coefficient = factor[t] * (parameter[t] >= 0 ? parameters[parameter[t]] : 1.0);
            var indices = powers[t];
            for (var skip = 0; skip < indices.Length; skip++)
            {
                var value = coefficient;
                for (var k = 0; k < indices.Length; k++)
                {
                    if (k != skip)
                    {
                        value *= state[indices[k]];
                    }
                }

                jacobian[(equation[t] * n) + indices[skip]] += value;
            }
        }
    }

    public void EvaluateParameterJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        var m = ParameterCount;
        jacobian.Clear();
        for (var t = 0; t < factor.Length; t++)
        {
            if (parameter[t] < 0)
            {
                continue;
            }

            var value = factor[t];
            foreach (var index in powers[t])
            {
                value *= state[index];
            }

            jacobian[(equation[t] * m) + parameter[t]] += value;
        }
    }
}

using System.Collections.Immutable;
using Patchproof.Core.Circuits.Targets;
using Patchproof.Core.Models;

namespace Patchproof.Core.Circuits.Boards;

/// <summary>A board as an ODE system in volts and seconds: states are the integrator outputs, parameters the parts' log-deviations.</summary>
/// <remarks>
/// <para>State j is the output voltage V_j of the integrator for <see cref="BoardDesign.Variables"/>[j].
/// Parameter i is u_i = ln(value_i / nominal_i) for <see cref="BoardDesign.Parts"/>[i], so the zero
/// vector is the board as drawn and a part 10 % high has u = ln 1.1 (see
/// <see cref="ParameterVector"/>).</para>
/// <para>Each evaluation computes every node (summers V = -R_f sum u/R, multipliers kappa X Y +
/// offset, references, function blocks) in dependency order, clipping algebraic outputs at the
/// output limit, then each integrator's derivative with offsets, bias currents and leak (see
/// <see cref="BoardNonIdealities"/>). An integrator near its limit stops integrating outward
/// (smoothly over the knee width, or hard).</para>
/// <para>Jacobians are central finite differences (the clipping makes the system piecewise; the
/// board simulation needs no Jacobian). Evaluation does not allocate; designs of up to a few
/// hundred parts and nodes fit the stack buffers.</para>
/// </remarks>
public sealed class BoardOdeSystem : IOdeSystem
{
    private readonly double[] nominal;
    private readonly NodeOperation[] operations;
    private readonly int[] operationNode;
    private readonly IntegratorOperation[] integrators;
    private readonly double limit;
    private readonly double knee;
    private readonly OutputClipping clipping;

    private BoardOdeSystem(BoardDesign design, BoardNonIdealities nonIdealities)
    {
        Design = design;
        NonIdealities = nonIdealities;
        nominal = [.. design.Parts.Select(part => part.NominalValue)];
        limit = design.OutputLimitVolts;
        knee = Math.Min(nonIdealities.ClipKneeVolts, limit / 2);
        clipping = nonIdealities.Clipping;
        StateNames = [.. design.Variables.Select(variable => variable.Name)];
        ParameterNames = [.. design.Parts.Select(part => part.Id)];

        var nodeNames = new List<string>(StateNames) { BoardDesign.GroundNode };
        var nodeIndex = nodeNames.Select((name, index) => (name, index)).ToDictionary(pair => pair.name, pair => pair.index, StringComparer.Ordinal);
        var partIndex = design.Parts.Select((part, index) => (part.Id, index)).ToDictionary(pair => pair.Id, pair => pair.index, StringComparer.Ordinal);
        var ops = new List<NodeOperation>();
        var opNodes = new List<int>();

        int Resolve(string node)
        {
            if (nodeIndex.TryGetValue(node, out var found))
            {
                return found;
            }

            var block = design.FindBlock(node)!;
            NodeOperation operation = block switch
            {
                SummerBlock summer => new SummerOperation(partIndex[summer.FeedbackResistorId], [.. summer.Inputs.Select(input => Resolve(input.From))], [.. summer.Inputs.Select(input => partIndex[input.ResistorId])]),
                MultiplierBlock multiplier => new MultiplierOperation(partIndex[multiplier.PartId], Resolve(multiplier.X), Resolve(multiplier.Y), nonIdealities.MultiplierOutputOffsetsVolts.GetValueOrDefault(multiplier.PartId)),
                ReferenceBlock reference => new ReferenceOperation(partIndex[reference.PartId], Math.Sign(design.NominalOf(reference.PartId))),
                FunctionBlock function => new FunctionOperation(Resolve(function.Input), function),
                _ => throw new ArgumentException($"node '{node}' has no block", nameof(design)),
            };
            var index = nodeNames.Count;
            nodeNames.Add(node);
            nodeIndex[node] = index;
            ops.Add(operation);
            opNodes.Add(index);
            return index;
        }

        var integratorList = new List<IntegratorOperation>();
        foreach (var variable in design.Variables)
        {
            var block = design.Integrators.First(integrator => integrator.Variable == variable.Name);
            integratorList.Add(new IntegratorOperation(
                partIndex[block.CapacitorId],
                [.. block.Inputs.Select(input => Resolve(input.From))],
                [.. block.Inputs.Select(input => partIndex[input.ResistorId])],
                nonIdealities.IntegratorInputOffsetsVolts.GetValueOrDefault(variable.Name),
                nonIdealities.IntegratorBiasCurrentsAmperes.GetValueOrDefault(variable.Name)));
        }

        foreach (var block in design.Blocks.Where(block => block is not IntegratorBlock))
        {
            Resolve(block.Output);
        }

        operations = [.. ops];
        operationNode = [.. opNodes];
        integrators = [.. integratorList];
        NodeNames = nodeNames;
    }

    /// <summary>The design simulated.</summary>
    public BoardDesign Design { get; }

    /// <summary>The non-idealities simulated.</summary>
    public BoardNonIdealities NonIdealities { get; }

    /// <inheritdoc/>
    public int StateCount => StateNames.Count;

    /// <inheritdoc/>
    public int ParameterCount => ParameterNames.Count;

    /// <summary>The variable names (states are their integrators' output voltages).</summary>
    public IReadOnlyList<string> StateNames { get; }

    /// <summary>The part ids (parameters are their log-deviations ln(value / nominal)).</summary>
    public IReadOnlyList<string> ParameterNames { get; }

    /// <summary>Every node in evaluation order: the variables, ground, then each block's output.</summary>
    public IReadOnlyList<string> NodeNames { get; }

    /// <summary>Builds the system for a valid design.</summary>
    /// <param name="design">The design (see <see cref="DesignValidator"/>).</param>
    /// <param name="nonIdealities">Clipping, offsets and leak; default <see cref="BoardNonIdealities"/> (smooth clipping only).</param>
    /// <returns>The system.</returns>
    /// <exception cref="ArgumentException">The design has problems.</exception>
    public static BoardOdeSystem Create(BoardDesign design, BoardNonIdealities? nonIdealities = null)
    {
        ArgumentNullException.ThrowIfNull(design);
        var problems = DesignValidator.Validate(design);
        if (problems.Count > 0)
        {
            throw new ArgumentException("The design has problems: " + string.Join("; ", problems.Take(5)), nameof(design));
        }

        return new BoardOdeSystem(design, nonIdealities ?? new BoardNonIdealities());
    }

    /// <summary>The parameter vector for parts deviating by given fractions (+0.10 for 10 % high); other parts nominal.</summary>
    /// <param name="relativeDeviations">Deviation by part id, each above -1.</param>
    /// <returns>u_i = ln(1 + deviation_i).</returns>
    /// <exception cref="ArgumentException">A part id is unknown.</exception>
    public ImmutableArray<double> ParameterVector(IReadOnlyDictionary<string, double>? relativeDeviations = null)
    {
        var vector = new double[ParameterCount];
        if (relativeDeviations is not null)
        {
            foreach (var (id, deviation) in relativeDeviations)
            {
                var index = ParameterNames.ToList().IndexOf(id);
                if (index < 0)
                {
                    throw new ArgumentException($"no part '{id}' in the design", nameof(relativeDeviations));
                }

                Preconditions.CheckArgumentRange(nameof(relativeDeviations), deviation > -1, "a deviation must be above -100 %");
                vector[index] = Math.Log(1 + deviation);
            }
        }

        return [.. vector];
    }

    /// <summary>The starting voltages: each integrator's <see cref="IntegratorBlock.InitialVolts"/>, else the model's default start scaled, else 0.</summary>
    /// <param name="target">The model, for its default initial state, or null.</param>
    /// <returns>One voltage per state.</returns>
    public ImmutableArray<double> InitialState(TargetSystem? target)
    {
        var state = new double[StateCount];
        for (var j = 0; j < StateCount; j++)
        {
            var variable = Design.Variables[j];
            var block = Design.Integrators.First(integrator => integrator.Variable == variable.Name);
            var modelIndex = target is null ? -1 : target.Variables.IndexOf(variable.Name);
            state[j] = block.InitialVolts ?? (modelIndex >= 0 ? variable.ToVolts(target!.DefaultInitialState[modelIndex]) : 0);
        }

        return [.. state];
    }

    /// <summary>Writes every node's voltage (see <see cref="NodeNames"/>) for a state and parameters.</summary>
    /// <param name="state">Integrator outputs, volts.</param>
    /// <param name="parameters">Part log-deviations.</param>
    /// <param name="nodes">Receives one voltage per node.</param>
    public void EvaluateNodes(ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> nodes)
    {
        Preconditions.CheckArgumentRange(nameof(nodes), nodes.Length == NodeNames.Count, $"must have {NodeNames.Count} entries");
        Span<double> values = stackalloc double[nominal.Length];
        PartValues(parameters, values);
        ComputeNodes(state, values, nodes);
    }

    /// <inheritdoc/>
    public void Evaluate(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> derivative)
    {
        Span<double> values = stackalloc double[nominal.Length];
        Span<double> nodes = stackalloc double[NodeNames.Count];
        PartValues(parameters, values);
        ComputeNodes(state, values, nodes);
        for (var j = 0; j < integrators.Length; j++)
        {
            var rate = integrators[j].Rate(nodes, values, state[j], NonIdealities.IntegratorDcGain);
            derivative[j] = clipping switch
            {
                OutputClipping.None => rate,
                OutputClipping.Hard => (rate > 0 && state[j] >= limit) || (rate < 0 && state[j] <= -limit) ? 0 : rate,
                _ => rate * Gate(rate > 0 ? limit - state[j] : limit + state[j]),
            };
        }
    }

    /// <inheritdoc/>
    public void EvaluateStateJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        var n = StateCount;
        Span<double> shifted = stackalloc double[n];
        Span<double> plus = stackalloc double[n];
        Span<double> minus = stackalloc double[n];
        state.CopyTo(shifted);
        for (var k = 0; k < n; k++)
        {
            var step = 1e-6 * (1 + Math.Abs(state[k]));
            shifted[k] = state[k] + step;
            Evaluate(time, shifted, parameters, plus);
            shifted[k] = state[k] - step;
            Evaluate(time, shifted, parameters, minus);
            shifted[k] = state[k];
            for (var i = 0; i < n; i++)
            {
                jacobian[(i * n) + k] = (plus[i] - minus[i]) / (2 * step);
            }
        }
    }

    /// <inheritdoc/>
    public void EvaluateParameterJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        var n = StateCount;
        var m = ParameterCount;
        Span<double> shifted = stackalloc double[m];
        Span<double> plus = stackalloc double[n];
        Span<double> minus = stackalloc double[n];
        parameters.CopyTo(shifted);
        for (var k = 0; k < m; k++)
        {
            const double step = 1e-6;
            shifted[k] = parameters[k] + step;
            Evaluate(time, state, shifted, plus);
            shifted[k] = parameters[k] - step;
            Evaluate(time, state, shifted, minus);
            shifted[k] = parameters[k];
            for (var i = 0; i < n; i++)
            {
                jacobian[(i * m) + k] = (plus[i] - minus[i]) / (2 * step);
            }
        }
    }

    private void PartValues(ReadOnlySpan<double> parameters, Span<double> values)
    {
        for (var i = 0; i < nominal.Length; i++)
        {
            values[i] = Math.Abs(nominal[i]) * Math.Exp(parameters[i]);
        }
    }

    private void ComputeNodes(ReadOnlySpan<double> state, ReadOnlySpan<double> values, Span<double> nodes)
    {
        state.CopyTo(nodes);
        nodes[state.Length] = 0;
        for (var k = 0; k < operations.Length; k++)
        {
            nodes[operationNode[k]] = Clip(operations[k].Compute(nodes, values));
        }
    }

    private double Clip(double volts)
    {
        switch (clipping)
        {
            case OutputClipping.None:
                return volts;
            case OutputClipping.Hard:
                return Math.Clamp(volts, -limit, limit);
            default:
                var magnitude = Math.Abs(volts);
                var start = limit - knee;
                return magnitude <= start ? volts : Math.CopySign(start + (knee * Math.Tanh((magnitude - start) / knee)), volts);
        }
    }

    private double Gate(double headroom)
    {
        if (headroom >= knee)
        {
            return 1;
        }

        if (headroom <= 0)
        {
            return 0;
        }

        var t = headroom / knee;
        return t * t * (3 - (2 * t));
    }

    private abstract class NodeOperation
    {
        public abstract double Compute(ReadOnlySpan<double> nodes, ReadOnlySpan<double> values);
    }

    private sealed class SummerOperation(int feedback, int[] inputs, int[] resistors) : NodeOperation
    {
        public override double Compute(ReadOnlySpan<double> nodes, ReadOnlySpan<double> values)
        {
            var current = 0.0;
            for (var k = 0; k < inputs.Length; k++)
            {
                current += nodes[inputs[k]] / values[resistors[k]];
            }

            return -values[feedback] * current;
        }
    }

    private sealed class MultiplierOperation(int part, int x, int y, double offsetVolts) : NodeOperation
    {
        public override double Compute(ReadOnlySpan<double> nodes, ReadOnlySpan<double> values) =>
            (values[part] * nodes[x] * nodes[y]) + offsetVolts;
    }

    private sealed class ReferenceOperation(int part, int sign) : NodeOperation
    {
        public override double Compute(ReadOnlySpan<double> nodes, ReadOnlySpan<double> values) => sign * values[part];
    }

    private sealed class FunctionOperation(int input, FunctionBlock block) : NodeOperation
    {
        private readonly double[] inputs = [.. block.Points.Select(point => point.InputVolts)];
        private readonly double[] outputs = [.. block.Points.Select(point => point.OutputVolts)];

        public override double Compute(ReadOnlySpan<double> nodes, ReadOnlySpan<double> values)
        {
            var v = nodes[input];
            var index = 1;
            while (index < inputs.Length - 1 && v > inputs[index])
            {
                index++;
            }

            var slope = (outputs[index] - outputs[index - 1]) / (inputs[index] - inputs[index - 1]);
            return outputs[index - 1] + (slope * (v - inputs[index - 1]));
        }
    }

    private sealed class IntegratorOperation(int capacitor, int[] inputs, int[] resistors, double offsetVolts, double biasAmperes)
    {
        public double Rate(ReadOnlySpan<double> nodes, ReadOnlySpan<double> values, double output, double dcGain)
        {
            var current = biasAmperes;
            var conductance = 0.0;
            for (var k = 0; k < inputs.Length; k++)
            {
                var g = 1.0 / values[resistors[k]];
                current += (offsetVolts - nodes[inputs[k]]) * g;
                conductance += g;
            }

            var leak = double.IsPositiveInfinity(dcGain) ? 0 : output / dcGain * conductance;
            return (current - leak) / values[capacitor];
        }
    }
}

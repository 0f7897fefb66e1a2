using System.Collections.Immutable;

namespace Patchproof.Core.Circuits;

/// <summary>The model a design is meant to realize: its name and the parameter values the board was drawn for.</summary>
/// <param name="Name">The model's name, for example <c>lorenz</c>.</param>
/// <param name="Parameters">Parameter values that differ from the model's defaults, by name.</param>
public sealed record ModelReference(string Name, ImmutableDictionary<string, double> Parameters)
{
    /// <summary>A reference to a model with its default parameters.</summary>
    /// <param name="name">The model's name.</param>
    /// <returns>The reference.</returns>
    public static ModelReference Of(string name) => new(name, ImmutableDictionary<string, double>.Empty);
}

/// <summary>A board as drawn: variables with their scales, parts with nominal values, and the blocks that connect them.</summary>
/// <remarks>
/// <para>Scaling (DESIGN.md): V_j = sign_j * s_j * x_j and t = tau * T, with tau =
/// <see cref="TimeScaleSeconds"/> seconds per problem time unit. Each integrator realizes
/// dV_j/dt = -(1/C_j) * sum_k u_k / R_jk; <see cref="Terms"/> expands every input through the
/// summers, multipliers and references it passes into coefficient-times-basis terms with their part
/// paths.</para>
/// <para>Op-amp outputs swing to about <see cref="OutputLimitVolts"/> (13 V on +/-15 V rails, common
/// practice); the machine unit (full scale of a problem variable) is <see cref="MachineUnitVolts"/>
/// (10 V, common practice).</para>
/// <para>A design built in code is not checked on construction; <see cref="DesignValidator"/> lists
/// what is wrong with it, and the file reader refuses a design with problems.</para>
/// </remarks>
/// <param name="Board">The board's id, for example <c>QH-L3</c>.</param>
/// <param name="Title">A readable name, for example <c>Wren</c>.</param>
/// <param name="Model">The model the board realizes, or null when none is named.</param>
/// <param name="TimeScaleSeconds">tau, seconds per problem time unit, positive.</param>
/// <param name="Variables">The problem variables, each realized by one integrator.</param>
/// <param name="Parts">Every part with its id, nominal value and tolerance.</param>
/// <param name="Blocks">Integrators, summers, multipliers, references and function blocks.</param>
public sealed record BoardDesign(
    string Board,
    string Title,
    ModelReference? Model,
    double TimeScaleSeconds,
    ImmutableArray<DesignVariable> Variables,
    ImmutableArray<Part> Parts,
    ImmutableArray<DesignBlock> Blocks)
{
    /// <summary>Default output limit: about 13 V on +/-15 V rails (common practice).</summary>
    public const double DefaultOutputLimitVolts = 13.0;

    /// <summary>The node name of ground (0 V), always available as an input: an integrator input wired to it contributes no term.</summary>
    public const string GroundNode = "gnd";

    /// <summary>Default machine unit: +/-10 V full scale (common practice).</summary>
    public const double DefaultMachineUnitVolts = 10.0;

    /// <summary>A free-text description of the board.</summary>
    public string Description { get; init; } = string.Empty;

    /// <summary>Where op-amp outputs clip, in volts (positive); default 13 V.</summary>
    public double OutputLimitVolts { get; init; } = DefaultOutputLimitVolts;

    /// <summary>The machine unit in volts; default 10 V.</summary>
    public double MachineUnitVolts { get; init; } = DefaultMachineUnitVolts;

    /// <summary>The integrators, in the order of <see cref="Variables"/>.</summary>
    public IEnumerable<IntegratorBlock> Integrators =>
        Variables.Select(variable => Blocks.OfType<IntegratorBlock>().FirstOrDefault(block => block.Variable == variable.Name)).OfType<IntegratorBlock>();

    /// <summary>Finds a part by id.</summary>
    /// <param name="id">The part's id.</param>
    /// <returns>The part, or null.</returns>
    public Part? FindPart(string id) => Parts.FirstOrDefault(part => part.Id == id);

    /// <summary>Finds a variable by name.</summary>
    /// <param name="name">The variable's name.</param>
    /// <returns>The variable, or null.</returns>
    public DesignVariable? FindVariable(string name) => Variables.FirstOrDefault(variable => variable.Name == name);

    /// <summary>Finds the block driving a node.</summary>
    /// <param name="node">The node name.</param>
    /// <returns>The block, or null.</returns>
    public DesignBlock? FindBlock(string node) => Blocks.FirstOrDefault(block => block.Output == node);

    /// <summary>The nominal value of a part.</summary>
    /// <param name="id">The part's id.</param>
    /// <returns>Its nominal value.</returns>
    /// <exception cref="ArgumentException">No part has this id.</exception>
    public double NominalOf(string id) => FindPart(id)?.NominalValue ?? throw new ArgumentException($"no part '{id}' in the design", nameof(id));

    /// <summary>Every term of every integrator in machine units, with its part paths.</summary>
    /// <returns>The terms, equation by equation in the order of <see cref="Variables"/>.</returns>
    /// <exception cref="ArgumentException">The design has structural problems (see <see cref="DesignValidator"/>).</exception>
    public ImmutableArray<DesignTerm> Terms() => DesignTermExpansion.Expand(this);

    /// <summary>The terms a part serves.</summary>
    /// <param name="partId">The part's id.</param>
    /// <returns>The terms whose paths contain the part.</returns>
    public IEnumerable<DesignTerm> TermsServedBy(string partId) => Terms().Where(term => term.PartIds.Contains(partId));

    /// <summary>A copy with some parts' nominal values replaced.</summary>
    /// <param name="values">New values by part id.</param>
    /// <returns>The changed design.</returns>
    public BoardDesign WithPartValues(IReadOnlyDictionary<string, double> values)
    {
        ArgumentNullException.ThrowIfNull(values);
        return this with { Parts = [.. Parts.Select(part => values.TryGetValue(part.Id, out var value) ? part.WithNominalValue(value) : part)] };
    }

    /// <summary>The problem-unit coefficient of a machine term: c = theta * tau * prod(sign_i s_i) / (sign_j s_j).</summary>
    /// <param name="term">A term of this design.</param>
    /// <param name="coefficient">Its machine coefficient theta (default: the nominal one).</param>
    /// <returns>The coefficient in dx_j/dT = ... + c * phi(x); for a function basis, per volt of g.</returns>
    public double ToProblemCoefficient(DesignTerm term, double? coefficient = null)
    {
        ArgumentNullException.ThrowIfNull(term);
        var theta = coefficient ?? term.NominalCoefficient;
        var own = FindVariable(term.Variable) ?? throw new ArgumentException($"no variable '{term.Variable}'", nameof(term));
        var scale = TimeScaleSeconds / own.SignedScale;
        if (term.Basis.Function is null)
        {
            foreach (var name in term.Basis.Variables)
            {
                scale *= (FindVariable(name) ?? throw new ArgumentException($"no variable '{name}'", nameof(term))).SignedScale;
            }
        }

        return theta * scale;
    }
}

using System.Collections.Immutable;

namespace Patchproof.Core.Circuits;

/// <summary>One input of an integrator or summer: the node it comes from and the resistor it passes.</summary>
/// <param name="From">A node name: a variable (integrator output) or another block's output.</param>
/// <param name="ResistorId">The id of the input resistor in <see cref="BoardDesign.Parts"/>.</param>
public sealed record BlockInput(string From, string ResistorId);

/// <summary>A block of the board; each has one output node, named by <see cref="Output"/>.</summary>
/// <param name="Output">The node the block drives; other blocks refer to it by this name.</param>
public abstract record DesignBlock(string Output);

/// <summary>An inverting integrator: dV/dt = -(1/C) * sum_k u_k / R_k.</summary>
/// <remarks>Its output node is the variable's name; its voltage is V = sign * s * x (see <see cref="DesignVariable"/>).</remarks>
/// <param name="Variable">The variable the integrator produces (its output node).</param>
/// <param name="CapacitorId">The id of its feedback capacitor.</param>
/// <param name="Inputs">Its summing inputs, each with its resistor.</param>
/// <param name="InitialVolts">The output at the start (the initial-condition setting), or null to take the model's.</param>
public sealed record IntegratorBlock(string Variable, string CapacitorId, ImmutableArray<BlockInput> Inputs, double? InitialVolts = null) : DesignBlock(Variable);

/// <summary>An inverting summer: V_out = -R_f * sum_k u_k / R_k. With one input it is an inverter of gain -R_f / R_in.</summary>
/// <param name="Output">Its output node name, for example <c>-y</c>.</param>
/// <param name="FeedbackResistorId">The id of its feedback resistor R_f.</param>
/// <param name="Inputs">Its inputs, each with its resistor.</param>
public sealed record SummerBlock(string Output, string FeedbackResistorId, ImmutableArray<BlockInput> Inputs) : DesignBlock(Output)
{
    /// <summary>True when the summer has a single input (an inverter).</summary>
    public bool IsInverter => Inputs.Length == 1;
}

/// <summary>A four-quadrant multiplier: W = kappa * X * Y, kappa being its part's value (nominally 0.1 /V).</summary>
/// <param name="Output">Its output node name.</param>
/// <param name="PartId">The id of the multiplier part (its scale factor).</param>
/// <param name="X">The node on its X input.</param>
/// <param name="Y">The node on its Y input.</param>
public sealed record MultiplierBlock(string Output, string PartId, string X, string Y) : DesignBlock(Output);

/// <summary>A reference voltage for constant terms; its part's value is the voltage (signed).</summary>
/// <param name="Output">Its output node name.</param>
/// <param name="PartId">The id of the reference part.</param>
public sealed record ReferenceBlock(string Output, string PartId) : DesignBlock(Output);

/// <summary>One corner of a piecewise-linear function block, in volts.</summary>
/// <param name="InputVolts">The input voltage.</param>
/// <param name="OutputVolts">The output voltage there.</param>
public sealed record FunctionPoint(double InputVolts, double OutputVolts);

/// <summary>A piecewise-linear function block (diode-type nonlinearity): V_out = g(V_in), linear between corners, extended with the end slopes.</summary>
/// <param name="Output">Its output node name.</param>
/// <param name="Input">The node it reads; must be a variable.</param>
/// <param name="Points">At least two corners with strictly increasing input voltage.</param>
public sealed record FunctionBlock(string Output, string Input, ImmutableArray<FunctionPoint> Points) : DesignBlock(Output)
{
    /// <summary>g(v): linear interpolation between the corners, linear extension beyond the ends.</summary>
    /// <param name="inputVolts">The input voltage.</param>
    /// <returns>The output voltage.</returns>
    public double Evaluate(double inputVolts)
    {
        var points = Points;
        var index = 1;
        while (index < points.Length - 1 && inputVolts > points[index].InputVolts)
        {
            index++;
        }

        var left = points[index - 1];
        var right = points[index];
        var slope = (right.OutputVolts - left.OutputVolts) / (right.InputVolts - left.InputVolts);
        return left.OutputVolts + (slope * (inputVolts - left.InputVolts));
    }
}

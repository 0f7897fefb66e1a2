using System.Collections.Immutable;
using System.Globalization;
using Patchproof.Core.Circuits.Targets;

namespace Patchproof.Core.Circuits.Building;

/// <summary>From a model to a board: amplitude scales, capacitors, input resistors, inverters, multipliers and references, rounded to a series.</summary>
/// <remarks>
/// <para>Scales: s_j = machine unit / range_j, rounded down to 1, 2, 2.5, 4 or 5 times a power of
/// ten so the expected peak stays within the machine unit and below the output limit; signs +1.</para>
/// <para>Capacitors: C = tau / R0 rounded to the capacitor series. The machine coefficient of a
/// model term c * phi(x) is theta = c * s_j / (tau * prod s_i) (the inverse of de-scaling). The
/// inverting integrator gives -theta' / (R C) for an input of gain theta'; so a negative theta takes
/// the signal directly and a positive one through an inverter (100 kΩ / 100 kΩ) or, for a product,
/// through a multiplier fed with an inverted input. R = g / (|theta| C) with g = 1 for a voltage,
/// kappa for a multiplier output, |V_ref| for a reference, rounded to the resistor series.</para>
/// <para>Rounding a resistor from R to R' changes its coefficient by R / R' - 1; the capacitor's
/// rounding is absorbed by computing the resistors with the chosen capacitor.</para>
/// </remarks>
public static class DesignBuilder
{
    private static readonly double[] NiceScales = [1, 2, 2.5, 4, 5];

    /// <summary>Proposes a design.</summary>
    /// <param name="target">The model.</param>
    /// <param name="parameters">Parameter values replacing the model's defaults, or null.</param>
    /// <param name="options">Ranges, time scale and series; default <see cref="DesignBuildOptions"/>.</param>
    /// <returns>The design with its roundings and notes.</returns>
    /// <exception cref="ArgumentException">A term has degree 3 or more, which needs more than one multiplier per term.</exception>
    public static DesignProposal Propose(TargetSystem target, IReadOnlyDictionary<string, double>? parameters = null, DesignBuildOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(target);
        options ??= new DesignBuildOptions();
        Preconditions.CheckArgumentRange(nameof(options), options.TimeScaleSeconds > 0, "the time scale must be positive");
        var overrides = parameters ?? ImmutableDictionary<string, double>.Empty;
        var notes = new List<string>();
        var roundings = new List<PartRounding>();
        var parts = new List<Part>();
        var blocks = new List<DesignBlock>();
        var integratorInputs = target.Variables.ToDictionary(name => name, _ => new List<BlockInput>(), StringComparer.Ordinal);
        var resistorCount = 0;
        var multiplierCount = 0;
        var referenceCount = 0;

        var variables = new List<DesignVariable>();
        for (var i = 0; i < target.Variables.Length; i++)
        {
            var name = target.Variables[i];
            var range = options.Ranges.TryGetValue(name, out var given) ? given : target.TypicalRanges[i];
            Preconditions.CheckArgumentRange(nameof(options), range > 0 && double.IsFinite(range), $"the range of {name} must be positive");
            variables.Add(new DesignVariable(name, NiceScaleAtMost(options.MachineUnitVolts / range)));
        }

        var scaleOf = variables.ToDictionary(variable => variable.Name, variable => variable.ScaleVoltsPerUnit, StringComparer.Ordinal);
        var capacitorIdeal = options.TimeScaleSeconds / options.UnitResistorOhms;
        var capacitor = options.CapacitorSeries.Nearest(capacitorIdeal);

        string NewResistor(double ideal, string serves, bool isInput)
        {
            var chosen = options.ResistorSeries.Nearest(ideal);
            var id = "R" + (++resistorCount).ToString(CultureInfo.InvariantCulture);
            parts.Add(new Part(id, PartKind.Resistor, chosen, options.ResistorSeries.Tolerance, options.ResistorSeries));
            roundings.Add(new PartRounding(id, ideal, chosen, serves, isInput ? (ideal / chosen) - 1 : 0));
            if (chosen < 1e3 || chosen > 10e6)
            {
                notes.Add($"{id} ({ValueNotation.Format(chosen, Quantity.Resistance)}, {serves}) is outside 1 kΩ ... 10 MΩ: loading or leakage may matter; consider another time scale or amplitude scale");
            }

            return id;
        }

        string Inverted(string variable)
        {
            var node = "-" + variable;
            if (!blocks.Any(block => block.Output == node))
            {
                var feedback = NewResistor(options.UnitResistorOhms, $"inverter {node}", isInput: false);
                var input = NewResistor(options.UnitResistorOhms, $"inverter {node}", isInput: false);
                blocks.Add(new SummerBlock(node, feedback, [new BlockInput(variable, input)]));
            }

            return node;
        }

        string Product(string x, string y)
        {
            var node = (x.StartsWith('-') ? "-" : string.Empty) + x.TrimStart('-') + y;
            if (!blocks.Any(block => block.Output == node))
            {
                var id = "M" + (++multiplierCount).ToString(CultureInfo.InvariantCulture);
                parts.Add(new Part(id, PartKind.Multiplier, options.MultiplierScalePerVolt, options.MultiplierTolerance));
                blocks.Add(new MultiplierBlock(node, id, x, y));
            }

            return node;
        }

        foreach (var variable in target.Variables)
        {
            foreach (var term in target.TermsOf(variable))
            {
                var label = $"d{variable}/dt: {term.Basis.Key}";
                var c = term.Coefficient(name => target.ParameterValue(name, overrides));
                if (c == 0)
                {
                    continue;
                }

                var theta = c * scaleOf[variable] / options.TimeScaleSeconds;
                foreach (var name in term.Basis.Variables)
                {
                    theta /= scaleOf[name];
                }

                string from;
                double gain;
                switch (term.Basis.Degree)
                {
                    case 0:
                        var id = "VR" + (++referenceCount).ToString(CultureInfo.InvariantCulture);
                        parts.Add(new Part(id, PartKind.Reference, -Math.Sign(theta) * options.ReferenceVolts, 0.01));
                        from = "ref" + referenceCount.ToString(CultureInfo.InvariantCulture);
                        blocks.Add(new ReferenceBlock(from, id));
                        gain = options.ReferenceVolts;
                        break;
                    case 1:
                        from = theta < 0 ? term.Basis.Variables[0] : Inverted(term.Basis.Variables[0]);
                        gain = 1;
                        break;
                    case 2:
                        var first = term.Basis.Variables[0];
                        var second = term.Basis.Variables[1];
                        from = theta < 0 ? Product(first, second) : Product(Inverted(first), second);
                        gain = options.MultiplierScalePerVolt;
                        break;
                    default:
                        throw new ArgumentException($"{label} has degree {term.Basis.Degree}; the builder realizes terms of degree 0, 1 and 2", nameof(target));
                }

                integratorInputs[variable].Add(new BlockInput(from, NewResistor(gain / (Math.Abs(theta) * capacitor), label, isInput: true)));
            }
        }

        var capacitorIds = new List<string>();
        for (var j = 0; j < target.Variables.Length; j++)
        {
            var id = "C" + (j + 1).ToString(CultureInfo.InvariantCulture);
            parts.Add(new Part(id, PartKind.Capacitor, capacitor, options.CapacitorTolerance, options.CapacitorSeries));
            roundings.Add(new PartRounding(id, capacitorIdeal, capacitor, $"integrator {target.Variables[j]}", 0));
            capacitorIds.Add(id);
        }

        var integrators = target.Variables.Select((name, j) => (DesignBlock)new IntegratorBlock(name, capacitorIds[j], [.. integratorInputs[name]]));
        var ordered = parts.OrderBy(part => part.Kind).ThenBy(part => part.Id.Length).ThenBy(part => part.Id, StringComparer.Ordinal);
        var design = new BoardDesign(
            options.Board,
            options.Title,
            new ModelReference(target.Name, target.Parameters.ToImmutableDictionary(pair => pair.Key, pair => target.ParameterValue(pair.Key, overrides), StringComparer.Ordinal)),
            options.TimeScaleSeconds,
            [.. variables],
            [.. ordered],
            [.. integrators.Concat(blocks)])
        {
            OutputLimitVolts = options.OutputLimitVolts,
            MachineUnitVolts = options.MachineUnitVolts,
        };
        return new DesignProposal(design, [.. roundings], [.. notes]);
    }

    /// <summary>The largest of 1, 2, 2.5, 4, 5 times a power of ten not above <paramref name="value"/>.</summary>
    /// <param name="value">A positive number.</param>
    /// <returns>The nice number.</returns>
    public static double NiceScaleAtMost(double value)
    {
        Preconditions.CheckArgumentRange(nameof(value), value > 0 && double.IsFinite(value), "must be positive");
        var decade = Math.Pow(10, Math.Floor(Math.Log10(value)));
        var best = decade;
        foreach (var nice in NiceScales)
        {
            if (nice * decade <= value * (1 + 1e-12))
            {
                best = nice * decade;
            }
        }

        return best;
    }
}

namespace Patchproof.Core.Circuits;

/// <summary>Lists what is structurally wrong with a design: missing or wrong-kind parts, inputs from nodes that do not exist, loops.</summary>
/// <remarks>Paths name the place in the design file (<c>$.blocks[2].inputs[0].from</c>); block and part
/// indices are positions in <see cref="BoardDesign.Blocks"/> and <see cref="BoardDesign.Parts"/>,
/// which the file reader keeps in file order.</remarks>
public static class DesignValidator
{
    /// <summary>Checks a design.</summary>
    /// <param name="design">The design.</param>
    /// <returns>Every problem found; empty when the design can be expanded and simulated.</returns>
    public static IReadOnlyList<DesignProblem> Validate(BoardDesign design)
    {
        ArgumentNullException.ThrowIfNull(design);
        var problems = new List<DesignProblem>();
        if (!(design.TimeScaleSeconds > 0) || !double.IsFinite(design.TimeScaleSeconds))
        {
            problems.Add(new("$.timeScale", "must be a positive time such as 1 ms"));
        }

        var variableNames = new HashSet<string>(StringComparer.Ordinal);
        for (var i = 0; i < design.Variables.Length; i++)
        {
            var variable = design.Variables[i];
            if (!variableNames.Add(variable.Name))
            {
                problems.Add(new($"$.variables[{i}].name", $"variable '{variable.Name}' is declared twice"));
            }

            if (!(variable.ScaleVoltsPerUnit > 0) || !double.IsFinite(variable.ScaleVoltsPerUnit))
            {
                problems.Add(new($"$.variables[{i}].scale", "must be a positive number of volts per unit"));
            }

            if (variable.Sign is not (1 or -1))
            {
                problems.Add(new($"$.variables[{i}].sign", "must be + or -"));
            }
        }

        var partIndex = new Dictionary<string, int>(StringComparer.Ordinal);
        for (var i = 0; i < design.Parts.Length; i++)
        {
            var part = design.Parts[i];
            if (!partIndex.TryAdd(part.Id, i))
            {
                problems.Add(new($"$.parts[{i}].id", $"part '{part.Id}' is declared twice"));
            }

            var valueOk = part.Kind == PartKind.Reference ? part.NominalValue != 0 && double.IsFinite(part.NominalValue) : part.NominalValue > 0 && double.IsFinite(part.NominalValue);
            if (!valueOk)
            {
                problems.Add(new($"$.parts[{i}].value", part.Kind == PartKind.Reference ? "a reference voltage must be non-zero" : "must be a positive value"));
            }

            if (!(part.Tolerance >= 0) || part.Tolerance >= 1)
            {
                problems.Add(new($"$.parts[{i}].tolerance", "must be between 0 and 100 %"));
            }
        }

        var nodes = new Dictionary<string, int>(StringComparer.Ordinal);
        for (var b = 0; b < design.Blocks.Length; b++)
        {
            var output = design.Blocks[b].Output;
            if (!nodes.TryAdd(output, b))
            {
                problems.Add(new($"$.blocks[{b}].output", $"node '{output}' is driven by two blocks"));
            }
            else if (design.Blocks[b] is not IntegratorBlock && variableNames.Contains(output))
            {
                problems.Add(new($"$.blocks[{b}].output", $"'{output}' is a variable; only its integrator may drive it"));
            }
        }

        var partUse = new Dictionary<string, string>(StringComparer.Ordinal);
        void UsePart(string? id, PartKind kind, string path, string role)
        {
            if (string.IsNullOrWhiteSpace(id))
            {
                problems.Add(new(path, $"needs a {role}"));
                return;
            }

            if (!partIndex.TryGetValue(id, out var index))
            {
                problems.Add(new(path, $"part '{id}' is not in the parts list"));
                return;
            }

            if (design.Parts[index].Kind != kind)
            {
                problems.Add(new(path, $"part '{id}' is a {design.Parts[index].Kind.ToString().ToLowerInvariant()}, not a {kind.ToString().ToLowerInvariant()}"));
            }

            if (!partUse.TryAdd(id, path))
            {
                problems.Add(new(path, $"part '{id}' is already used at {partUse[id]}; one part serves one place"));
            }
        }

        void CheckNode(string node, string path)
        {
            if (string.IsNullOrWhiteSpace(node))
            {
                problems.Add(new(path, "needs a node name"));
            }
            else if (node != BoardDesign.GroundNode && !nodes.ContainsKey(node) && !variableNames.Contains(node))
            {
                problems.Add(new(path, $"no variable or block output is named '{node}'"));
            }
        }

        for (var b = 0; b < design.Blocks.Length; b++)
        {
            var at = $"$.blocks[{b}]";
            switch (design.Blocks[b])
            {
                case IntegratorBlock integrator:
                    if (!variableNames.Contains(integrator.Variable))
                    {
                        problems.Add(new($"{at}.output", $"'{integrator.Variable}' is not a declared variable"));
                    }

                    UsePart(integrator.CapacitorId, PartKind.Capacitor, $"{at}.capacitor", "capacitor");
                    CheckInputs(integrator.Inputs, at);
                    break;
                case SummerBlock summer:
                    UsePart(summer.FeedbackResistorId, PartKind.Resistor, $"{at}.feedback", "feedback resistor");
                    if (summer.Inputs.IsDefaultOrEmpty)
                    {
                        problems.Add(new($"{at}.inputs", "a summer or inverter needs at least one input"));
                    }

                    CheckInputs(summer.Inputs, at);
                    break;
                case MultiplierBlock multiplier:
                    UsePart(multiplier.PartId, PartKind.Multiplier, $"{at}.part", "multiplier part");
                    CheckNode(multiplier.X, $"{at}.x");
                    CheckNode(multiplier.Y, $"{at}.y");
                    foreach (var (node, field) in new[] { (multiplier.X, "x"), (multiplier.Y, "y") })
                    {
                        if (ReachesFunction(design, node, []))
                        {
                            problems.Add(new($"{at}.{field}", $"'{node}' carries a function block's output; a multiplier may only take variables, summers and references"));
                        }
                    }

                    break;
                case ReferenceBlock reference:
                    UsePart(reference.PartId, PartKind.Reference, $"{at}.part", "reference part");
                    break;
                case FunctionBlock function:
                    if (!variableNames.Contains(function.Input))
                    {
                        problems.Add(new($"{at}.input", $"a function block reads a variable, and '{function.Input}' is not one"));
                    }

                    if (function.Points.IsDefault || function.Points.Length < 2)
                    {
                        problems.Add(new($"{at}.points", "needs at least two corners"));
                    }
                    else
                    {
                        for (var k = 1; k < function.Points.Length; k++)
                        {
                            if (!(function.Points[k].InputVolts > function.Points[k - 1].InputVolts))
                            {
                                problems.Add(new($"{at}.points[{k}]", "input voltages must increase from corner to corner"));
                            }
                        }
                    }

                    break;
            }

            void CheckInputs(System.Collections.Immutable.ImmutableArray<BlockInput> inputs, string blockPath)
            {
                if (inputs.IsDefault)
                {
                    return;
                }

                for (var k = 0; k < inputs.Length; k++)
                {
                    CheckNode(inputs[k].From, $"{blockPath}.inputs[{k}].from");
                    UsePart(inputs[k].ResistorId, PartKind.Resistor, $"{blockPath}.inputs[{k}].resistor", "resistor");
                }
            }
        }

        foreach (var variable in design.Variables)
        {
            var count = design.Blocks.OfType<IntegratorBlock>().Count(block => block.Variable == variable.Name);
            if (count == 0)
            {
                problems.Add(new($"$.variables[{design.Variables.IndexOf(variable)}]", $"variable '{variable.Name}' has no integrator"));
            }
        }

        for (var b = 0; b < design.Blocks.Length; b++)
        {
            if (design.Blocks[b] is not IntegratorBlock && InLoop(design, design.Blocks[b].Output))
            {
                problems.Add(new($"$.blocks[{b}]", $"node '{design.Blocks[b].Output}' feeds back into itself without an integrator (an algebraic loop)"));
            }
        }

        return problems;
    }

    private static IEnumerable<string> AlgebraicInputs(DesignBlock block) => block switch
    {
        SummerBlock summer when !summer.Inputs.IsDefault => summer.Inputs.Select(input => input.From),
        MultiplierBlock multiplier => [multiplier.X, multiplier.Y],
        _ => [],
    };

    private static bool InLoop(BoardDesign design, string start)
    {
        var stack = new Stack<string>(AlgebraicInputs(design.FindBlock(start)!));
        var seen = new HashSet<string>(StringComparer.Ordinal);
        while (stack.Count > 0)
        {
            var node = stack.Pop();
            if (node == start)
            {
                return true;
            }

            if (seen.Add(node) && design.FindBlock(node) is { } block)
            {
                foreach (var next in AlgebraicInputs(block))
                {
                    stack.Push(next);
                }
            }
        }

        return false;
    }

    private static bool ReachesFunction(BoardDesign design, string node, HashSet<string> seen)
    {
        if (!seen.Add(node))
        {
            return false;
        }

        return design.FindBlock(node) switch
        {
            FunctionBlock => true,
            SummerBlock summer when !summer.Inputs.IsDefault => summer.Inputs.Any(input => ReachesFunction(design, input.From, seen)),
            MultiplierBlock multiplier => ReachesFunction(design, multiplier.X, seen) || ReachesFunction(design, multiplier.Y, seen),
            _ => false,
        };
    }
}

using System.CommandLine;
using System.Globalization;
using Patchproof.Core.Circuits;
using Patchproof.Core.Circuits.Checking;
using Patchproof.Core.Circuits.Targets;

namespace Patchproof.Cli.Verbs;

/// <summary><c>patchproof design check FILE [--model NAME | --model-file F]</c>: what a design realizes and what is wrong with it.</summary>
internal static class DesignCheckVerb
{
    public static Command Create(CliConsole console)
    {
        var file = new Argument<string>("file") { Description = "The design file (JSON, docs/circuits.md)." };
        var model = new Option<string?>("--model") { Description = "Check against this model instead of the one the design names." };
        var modelFile = new Option<string?>("--model-file") { Description = "Check against this model file in the equation language (docs/models.md), for a design made with design new --file." };
        var command = new Command("check", "Show the coefficients and problem parameters a design realizes, and every term or part that does not match its model.");
        command.Arguments.Add(file);
        command.Options.Add(model);
        command.Options.Add(modelFile);
        command.SetAction(parse => Run(console, parse.GetValue(file)!, parse.GetValue(model), parse.GetValue(modelFile)));
        return command;
    }

    private static int Run(CliConsole console, string path, string? modelName, string? modelFile)
    {
        if (modelName is not null && modelFile is not null)
        {
            console.Error.WriteLine("design check: give --model or --model-file, not both.");
            return PatchproofCommandLine.BadInput;
        }

        var design = DesignVerb.ReadDesign(console, path);
        if (design is null)
        {
            return PatchproofCommandLine.BadInput;
        }

        TargetSystem? target = null;
        if (modelFile is not null)
        {
            target = DesignVerb.ReadModelFile(console, modelFile);
            if (target is null)
            {
                return PatchproofCommandLine.BadInput;
            }
        }
        else if (modelName is not null)
        {
            target = DesignVerb.FindModel(console, modelName, "--model");
            if (target is null)
            {
                return PatchproofCommandLine.BadInput;
            }
        }
        else if (design.Model is { } reference)
        {
            DesignTargets.TryFind(reference.Name, out target);
        }

        var report = DesignCheck.Check(design, target);
        var output = console.Output;
        output.WriteLine($"{(design.Board.Length > 0 ? design.Board : path)} {design.Title}: {ValueNotation.Format(design.TimeScaleSeconds, Quantity.Time)} per problem time unit{(report.ModelName is null ? string.Empty : ", checked against " + report.ModelName)}");
        output.WriteLine();
        output.WriteLine("Findings:");
        if (report.Findings.IsEmpty)
        {
            output.WriteLine("  none: every model term is realized within the rounding of its parts.");
        }

        foreach (var finding in report.Findings)
        {
            output.WriteLine($"  {(finding.IsError ? "error" : "note ")}  {finding.Message}");
        }

        output.WriteLine();
        output.WriteLine("Terms (machine units; problem units after de-scaling):");
        output.WriteLine("  term             machine coefficient     problem   model     error     allowed  parts");
        foreach (var row in report.Terms)
        {
            var machine = row.Term is null ? "(missing)" : $"{DesignVerb.Number(row.Term.NominalCoefficient)} {row.Term.CoefficientUnit}";
            var expected = row.ExpectedProblemCoefficient is { } value ? DesignVerb.Number(value) : "-";
            var error = row.RelativeError is { } relative ? (relative * 100).ToString("+0.00;-0.00;0.00", CultureInfo.InvariantCulture) + " %" : "-";
            var parts = row.Term is null ? string.Empty : string.Join(" | ", row.Term.Paths);
            output.WriteLine($"  {row.Label,-16} {machine,-23} {DesignVerb.Number(row.RealizedProblemCoefficient),-9} {expected,-9} {error,-9} {(row.AllowedRelativeError * 100).ToString("0.0", CultureInfo.InvariantCulture) + " %",-8} {parts}");
        }

        if (!report.ImpliedParameters.IsEmpty)
        {
            output.WriteLine();
            output.WriteLine("Problem parameters the parts imply:");
            foreach (var parameter in report.ImpliedParameters)
            {
                var perTerm = parameter.PerTerm.Length > 1 ? " (" + string.Join(", ", parameter.PerTerm.Select(pair => $"{pair.Key}: {DesignVerb.Number(pair.Value)}")) + ")" : string.Empty;
                output.WriteLine($"  {parameter.Name} = {DesignVerb.Number(parameter.Value)}, model {DesignVerb.Number(parameter.Intended)} ({(parameter.RelativeError * 100).ToString("+0.00;-0.00;0.00", CultureInfo.InvariantCulture)} %){perTerm}");
            }
        }

        return report.Findings.IsEmpty ? PatchproofCommandLine.Success : DesignVerb.DoneWithWarnings;
    }
}

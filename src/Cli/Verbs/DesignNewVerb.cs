using System.Collections.Immutable;
using System.CommandLine;
using System.Globalization;
using Patchproof.Core.Circuits;
using Patchproof.Core.Circuits.Building;
using Patchproof.Core.Circuits.Files;
using Patchproof.Core.Circuits.Targets;
using Patchproof.Core.Simulation.Synthesis;

namespace Patchproof.Cli.Verbs;

/// <summary><c>patchproof design new --model NAME|--file F [--series E24] [--time-scale 1ms] [--range x=20,...] [--out F]</c>.</summary>
internal static class DesignNewVerb
{
    public static Command Create(CliConsole console)
    {
        var model = new Option<string?>("--model") { Description = $"A built-in model to realize: {string.Join(", ", DesignTargets.Names())} (the others have terms the board's blocks cannot compute)." };
        var file = new Option<string?>("--file") { Description = "A model file in the equation language (docs/models.md) to realize instead of --model; terms up to products of two states, constants, coefficients of one parameter each." };
        var series = new Option<string>("--series") { Description = "The resistor series: E6, E12, E24 (default), E48, E96.", DefaultValueFactory = _ => "E24" };
        var timeScale = new Option<string>("--time-scale") { Description = "Seconds per problem time unit, for example 1ms (default) or 47ms.", DefaultValueFactory = _ => "1 ms" };
        var ranges = new Option<string?>("--range") { Description = "Expected max |x| per variable in problem units, as x=20,y=27,z=48; by default found by simulating the model." };
        var board = new Option<string?>("--board") { Description = "The board id to write into the design, for example QH-L3." };
        var title = new Option<string?>("--title") { Description = "The board's name to write into the design." };
        var output = new Option<string?>("--out") { Description = "Write the design file here (default: print it)." };
        var command = new Command("new", "Propose a board for a model: amplitude scales, capacitors and resistors rounded to a series, with the error each rounding causes.");
        foreach (var option in new Option[] { model, file, series, timeScale, ranges, board, title, output })
        {
            command.Options.Add(option);
        }

        command.SetAction(parse => Run(console, parse.GetValue(model), parse.GetValue(file), parse.GetValue(series)!, parse.GetValue(timeScale)!, parse.GetValue(ranges), parse.GetValue(board), parse.GetValue(title), parse.GetValue(output)));
        return command;
    }

    private static int Run(CliConsole console, string? modelName, string? modelFile, string seriesName, string timeScaleText, string? rangeText, string? board, string? title, string? output)
    {
        if ((modelName is null) == (modelFile is null))
        {
            console.Error.WriteLine("design new: give either --model NAME or --file F.");
            return PatchproofCommandLine.BadInput;
        }

        var target = modelName is not null ? DesignVerb.FindModel(console, modelName, "--model") : DesignVerb.ReadModelFile(console, modelFile!);
        if (target is null)
        {
            return PatchproofCommandLine.BadInput;
        }

        if (!ESeries.TryFind(seriesName, out var series))
        {
            console.Error.WriteLine($"--series {seriesName}: unknown series; use E6, E12, E24, E48 or E96.");
            return PatchproofCommandLine.BadInput;
        }

        if (!ValueNotation.TryParse(timeScaleText, Quantity.Time, out var timeScale, out var timeError) || !(timeScale > 0))
        {
            console.Error.WriteLine($"--time-scale: {timeError ?? "must be positive"}");
            return PatchproofCommandLine.BadInput;
        }

        ImmutableDictionary<string, double> ranges;
        if (rangeText is null && !BuiltInTargets.All.Contains(target))
        {
            // A target built from a model already carries the ranges of its own trajectory from its initial state.
            ranges = target.Variables.Select((name, j) => (name, j)).ToImmutableDictionary(pair => pair.name, pair => target.TypicalRanges[pair.j], StringComparer.Ordinal);
            console.Output.WriteLine("Ranges found by simulating the model from its initial state: " + string.Join(", ", target.Variables.Select((name, j) => $"{name} {DesignVerb.Number(target.TypicalRanges[j], "G3")}")));
        }
        else if (rangeText is null)
        {
            ranges = ModelRangeFinder.FindRanges(target, settle: target.Name == "damped-oscillator" ? 0 : 20);
            console.Output.WriteLine("Ranges found by simulating the model: " + string.Join(", ", ranges.OrderBy(pair => target.Variables.IndexOf(pair.Key)).Select(pair => $"{pair.Key} {DesignVerb.Number(pair.Value, "G3")}")));
        }
        else
        {
            if (!DesignVerb.TryPairs(rangeText, out var pairs))
            {
                console.Error.WriteLine($"--range {rangeText}: expected VARIABLE=MAX, for example x=20,y=27,z=48.");
                return PatchproofCommandLine.BadInput;
            }

            var builder = ImmutableDictionary.CreateBuilder<string, double>(StringComparer.Ordinal);
            foreach (var (key, value) in pairs)
            {
                if (!target.Variables.Contains(key) || !double.TryParse(value, NumberStyles.Float, CultureInfo.InvariantCulture, out var range) || !(range > 0))
                {
                    console.Error.WriteLine($"--range {key}={value}: expected a variable of {target.Name} ({string.Join(", ", target.Variables)}) and a positive number.");
                    return PatchproofCommandLine.BadInput;
                }

                builder[key] = range;
            }

            ranges = builder.ToImmutable();
        }

        var proposal = DesignBuilder.Propose(target, null, new DesignBuildOptions
        {
            Ranges = ranges,
            TimeScaleSeconds = timeScale,
            ResistorSeries = series,
            Board = board ?? string.Empty,
            Title = title ?? string.Empty,
        });

        console.Output.WriteLine($"Design for {target.Name}, {ValueNotation.Format(timeScale, Quantity.Time)} per problem time unit, resistors from {series.Name}:");
        foreach (var variable in proposal.Design.Variables)
        {
            console.Output.WriteLine($"  {variable.Name}: {DesignVerb.Number(variable.ScaleVoltsPerUnit)} V per unit");
        }

        console.Output.WriteLine("  part   value        serves                coefficient error");
        foreach (var rounding in proposal.Roundings)
        {
            var part = proposal.Design.FindPart(rounding.PartId)!;
            console.Output.WriteLine($"  {rounding.PartId,-6} {part.NominalText,-12} {rounding.Serves,-21} {(rounding.CoefficientError * 100).ToString("+0.00;-0.00;0.00", CultureInfo.InvariantCulture)} %");
        }

        foreach (var note in proposal.Notes)
        {
            console.Output.WriteLine("  note: " + note);
        }

        var text = DesignFileWriter.Write(proposal.Design);
        if (output is null)
        {
            console.Output.Write(text);
        }
        else
        {
            try
            {
                File.WriteAllText(output, text);
            }
            catch (Exception exception) when (exception is IOException or UnauthorizedAccessException)
            {
                console.Error.WriteLine($"{output}: cannot write: {exception.Message}");
                return PatchproofCommandLine.BadInput;
            }

            console.Output.WriteLine($"Wrote {output}.");
        }

        return proposal.Notes.IsEmpty ? PatchproofCommandLine.Success : DesignVerb.DoneWithWarnings;
    }
}

using System.CommandLine;
using System.Globalization;
using Patchproof.Core;
using Patchproof.Core.Circuits;
using Patchproof.Core.Circuits.Files;
using Patchproof.Core.Circuits.Targets;

namespace Patchproof.Cli.Verbs;

/// <summary><c>patchproof design new|check|simulate</c>: board designs from a model, what a design realizes, and synthetic captures from a design.</summary>
internal static class DesignVerb
{
    /// <summary>Exit code of a run that finished but found something to warn about.</summary>
    public const int DoneWithWarnings = 3;

    public static Command Create(CliConsole console)
    {
        var command = new Command("design", "Board designs: propose one from a model, check what one realizes, simulate one into a capture.");
        command.Subcommands.Add(DesignNewVerb.Create(console));
        command.Subcommands.Add(DesignCheckVerb.Create(console));
        command.Subcommands.Add(DesignSimulateVerb.Create(console));
        return command;
    }

    /// <summary>Reads a design file, printing its errors and warnings; null when it cannot be used.</summary>
    public static BoardDesign? ReadDesign(CliConsole console, string path)
    {
        var result = DesignFileReader.ReadFile(path);
        foreach (var warning in result.Warnings)
        {
            console.Error.WriteLine($"{warning} (warning)");
        }

        foreach (var error in result.Errors)
        {
            console.Error.WriteLine(error);
        }

        return result.Success ? result.Value : null;
    }

    /// <summary>Finds a built-in model by name, printing the known names when it is unknown.</summary>
    public static TargetSystem? FindModel(CliConsole console, string name, string option)
    {
        if (BuiltInTargets.TryFind(name, out var target))
        {
            return target;
        }

        console.Error.WriteLine($"{option} {name}: unknown model; known models: {string.Join(", ", BuiltInTargets.All.Select(model => model.Name))}.");
        return null;
    }

    /// <summary>Splits <c>a=1,b=2</c> into pairs; false on an item without '='.</summary>
    public static bool TryPairs(string? text, out List<(string Key, string Value)> pairs)
    {
        pairs = [];
        foreach (var item in (text ?? string.Empty).Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
        {
            var equals = item.IndexOf('=', StringComparison.Ordinal);
            if (equals <= 0)
            {
                return false;
            }

            pairs.Add((item[..equals].Trim(), item[(equals + 1)..].Trim()));
        }

        return true;
    }

    public static string Number(double value, string format = "G5") => value.ToString(format, CultureInfo.InvariantCulture);
}

using System.CommandLine;
using System.Globalization;
using Patchproof.Core;
using Patchproof.Core.Circuits;
using Patchproof.Core.Circuits.Files;
using Patchproof.Core.Circuits.Targets;
using Patchproof.Core.Models;

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

    /// <summary>Finds a model a design can be built from by name, printing why when it is unknown or cannot be realized.</summary>
    public static TargetSystem? FindModel(CliConsole console, string name, string option)
    {
        if (DesignTargets.TryFind(name, out var target))
        {
            return target;
        }

        if (ModelTargets.FromCatalog(name) is { } refused)
        {
            console.Error.WriteLine($"{option} {name}: the board's blocks cannot realize this model:");
            foreach (var refusal in refused.Refusals)
            {
                console.Error.WriteLine("  " + refusal);
            }

            console.Error.WriteLine($"Models a design can be generated from: {string.Join(", ", DesignTargets.Names())}.");
            return null;
        }

        console.Error.WriteLine($"{option} {name}: unknown model; known models: {string.Join(", ", DesignTargets.Names())}.");
        return null;
    }

    /// <summary>Reads a model file of the equation language and builds its target, printing parse errors as file:line:column and refused terms; null when it cannot be used.</summary>
    public static TargetSystem? ReadModelFile(CliConsole console, string path)
    {
        string text;
        try
        {
            text = File.ReadAllText(path);
        }
        catch (Exception exception) when (exception is IOException or UnauthorizedAccessException)
        {
            console.Error.WriteLine($"{path}: cannot read: {exception.Message}");
            return null;
        }

        var parsed = ModelParser.Parse(text, path);
        foreach (var warning in parsed.Warnings)
        {
            console.Error.WriteLine($"{warning} (warning)");
        }

        foreach (var error in parsed.Errors)
        {
            console.Error.WriteLine(error);
        }

        if (!parsed.Success)
        {
            return null;
        }

        var result = ModelTargets.FromModel(parsed.Value, Path.GetFileNameWithoutExtension(path));
        if (result.Target is null)
        {
            console.Error.WriteLine($"{path}: the board's blocks cannot realize this model:");
            foreach (var refusal in result.Refusals)
            {
                console.Error.WriteLine($"  {path}:{(refusal.Line > 0 ? refusal.Line + ": " : string.Empty)}{refusal}");
            }
        }

        return result.Target;
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

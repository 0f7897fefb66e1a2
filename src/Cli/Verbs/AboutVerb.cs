using System.CommandLine;
using Patchproof.Core;

namespace Patchproof.Cli.Verbs;

/// <summary><c>patchproof about</c>: which core version runs, and the bench-safety reminder.</summary>
internal static class AboutVerb
{
    public static Command Create(CliConsole console)
    {
        var command = new Command("about", "Show the version of the numeric core and where the documentation lives.");
        command.SetAction(_ =>
        {
            console.Output.WriteLine($"patchproof {CoreAssembly.Version}");
            console.Output.WriteLine("Documentation: README.md and docs/ in the project's repository.");
            console.Output.WriteLine("Probing a powered board: keep to your lab's rules for bench supplies and live circuits.");
            return PatchproofCommandLine.Success;
        });
        return command;
    }
}

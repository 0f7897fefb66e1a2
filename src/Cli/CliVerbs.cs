using System.CommandLine;

namespace Patchproof.Cli;

/// <summary>The verbs of <c>patchproof</c>, one command each; add a new verb here.</summary>
internal static class CliVerbs
{
    public static IEnumerable<Command> All(CliConsole console)
    {
        yield return Verbs.AboutVerb.Create(console);
        yield return Verbs.DesignVerb.Create(console);
        yield return Verbs.InspectVerb.Create(console);
        yield return Verbs.SimulateVerb.Create(console);
        yield return Verbs.FitVerb.Create(console);
        yield return Verbs.CalibrateVerb.Create(console);
    }
}

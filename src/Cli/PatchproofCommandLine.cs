using System.CommandLine;

namespace Patchproof.Cli;

/// <summary>Builds the <c>patchproof</c> command tree and runs it against the given writers.</summary>
internal static class PatchproofCommandLine
{
    /// <summary>Exit code of a run that did what was asked.</summary>
    public const int Success = 0;

    /// <summary>Exit code when the input could not be read or the arguments were wrong.</summary>
    public const int BadInput = 2;

    /// <summary>Exit code when patchproof itself failed.</summary>
    public const int InternalFault = 70;

    public static int Run(string[] args, TextWriter output, TextWriter error)
    {
        var console = new CliConsole(output, error);
        var root = new RootCommand("Patchproof: check an analog-computer board against its design from scope captures.");
        foreach (var verb in CliVerbs.All(console))
        {
            root.Subcommands.Add(verb);
        }

        var parse = root.Parse(args);
        var configuration = new InvocationConfiguration { Output = output, Error = error, EnableDefaultExceptionHandler = false };
        try
        {
            return parse.Invoke(configuration);
        }
#pragma warning disable CA1031 // The last line of defence: a person gets one plain sentence, never a stack trace.
        catch (Exception exception)
#pragma warning restore CA1031
        {
            error.WriteLine($"patchproof: this is a fault in patchproof, not in your files ({exception.GetType().Name}: {exception.Message}). Nothing was written. Please report it with the command and the input files.");
            return InternalFault;
        }
    }
}

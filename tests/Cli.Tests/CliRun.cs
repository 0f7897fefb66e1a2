namespace Patchproof.Cli.Tests;

/// <summary>Runs the command line in-process and captures what it wrote.</summary>
internal static class CliRun
{
    public static (int ExitCode, string Output, string Error) Invoke(params string[] args)
    {
        using var output = new StringWriter();
        using var error = new StringWriter();
        var exitCode = PatchproofCommandLine.Run(args, output, error);
        return (exitCode, output.ToString(), error.ToString());
    }
}

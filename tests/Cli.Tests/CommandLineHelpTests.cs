namespace Patchproof.Cli.Tests;

public sealed class CommandLineHelpTests
{
    [Fact]
    public void Help_ListsEveryVerb()
    {
        var (exitCode, output, _) = CliRun.Invoke("--help");

        Assert.Equal(0, exitCode);
        Assert.Contains("about", output, StringComparison.Ordinal);
    }

    [Fact]
    public void UnknownVerb_FailsWithAMessage()
    {
        var (exitCode, _, error) = CliRun.Invoke("no-such-verb");

        Assert.NotEqual(0, exitCode);
        Assert.Contains("no-such-verb", error, StringComparison.Ordinal);
    }

    [Fact]
    public void About_PrintsVersionAndSafetyLine()
    {
        var (exitCode, output, _) = CliRun.Invoke("about");

        Assert.Equal(0, exitCode);
        Assert.Contains(Patchproof.Core.CoreAssembly.Version, output, StringComparison.Ordinal);
        Assert.Contains("lab's rules", output, StringComparison.Ordinal);
    }
}

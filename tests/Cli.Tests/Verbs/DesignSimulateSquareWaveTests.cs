using Patchproof.TestSupport;

namespace Patchproof.Cli.Tests.Verbs;

public sealed class DesignSimulateSquareWaveTests
{
    [Theory]
    [InlineData("--square-wave", "-10V", "--square-wave -10V:")]
    [InlineData("--square-wave", "10V@low", "--square-wave 10V@low:")]
    [InlineData("--square-period", "0ms", "--square-period 0ms:")]
    [InlineData("--edge-time", "1ms", "--edge-time 1ms:")]
    public void Simulate_BadSquareWave_ExitsTwoNamingTheOptionAndWritesNothing(string option, string value, string named)
    {
        var output = Path.Combine(Path.GetTempPath(), $"sq-{Guid.NewGuid():N}.csv");
        string[] squareWave = option == "--square-wave" ? [] : ["--square-wave", "10V"];

        var (exitCode, _, error) = CliRun.Invoke(["design", "simulate", Path.Combine(ReferenceDataFiles.RepositoryRoot, "designs", "qh-r1-gannet.json"), "--t-end", "20ms", .. squareWave, option, value, "--out", output]);

        Assert.Equal(2, exitCode);
        Assert.StartsWith(named, error, StringComparison.Ordinal);
        Assert.False(File.Exists(output));
    }
}
